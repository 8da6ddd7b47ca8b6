/**
 * How a decimal number is written in fray's files (optional sign, digits with an optional
 * point, optional exponent): one definition for durations, frequencies, angles and plain
 * numbers, kept as regular-expression source so the JSON Schemas can embed it too.
 */

/** The number itself, as regular-expression source with no groups that capture. */
export const NUMBER_SOURCE = '[+-]?(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][+-]?\\d+)?';

/** A plain decimal number written as text, with optional surrounding spaces and nothing else. */
export const PLAIN_NUMBER_RE = new RegExp(`^\\s*${NUMBER_SOURCE}\\s*$`);
