/**
 * fray's look for plots: the Okabe–Ito palette (distinguishable with the common forms of
 * colour blindness; Okabe & Ito, "Color Universal Design", 2008) in an order that also
 * separates in grey print (dark blue, orange, sky, vermillion, green, purple, yellow),
 * a dash pattern per series so lines read without colour, and a sequential ramp for heat maps.
 */
/** The Okabe–Ito colours by name (stated here once; palette.ts gives the report's roles to some of them). */
export const OKABE_ITO = {
  blue: '#0072B2',
  orange: '#E69F00',
  skyBlue: '#56B4E9',
  vermillion: '#D55E00',
  green: '#009E73',
  purple: '#CC79A7',
  yellow: '#F0E442',
  black: '#000000',
} as const;

/** Series colours of the study charts, in an order that separates in grey print. */
export const SERIES_COLORS = [OKABE_ITO.blue, OKABE_ITO.orange, OKABE_ITO.skyBlue, OKABE_ITO.vermillion, OKABE_ITO.green, OKABE_ITO.purple, OKABE_ITO.yellow, OKABE_ITO.black] as const;

/** Dash patterns per series (solid first), so series differ in grey print too. */
export const SERIES_DASHES: readonly (readonly number[])[] = [[1, 0], [6, 3], [2, 2], [8, 3, 2, 3], [4, 4], [1, 3]];

/** Sequential colour scheme of heat maps (a vega scheme that stays ordered in grey). */
export const HEATMAP_SCHEME = 'viridis';

/** Chart size in pixels and the shared configuration of every fray plot. */
export const PLOT_CONFIG = {
  view: { stroke: '#888888', continuousWidth: 520, continuousHeight: 300 },
  font: 'sans-serif',
  axis: { labelFontSize: 11, titleFontSize: 12, titleFontWeight: 'normal', gridColor: '#e4e4e4' },
  title: { fontSize: 13, anchor: 'start', fontWeight: 'bold' },
  legend: { labelFontSize: 11, titleFontSize: 11, orient: 'bottom', labelLimit: 400 },
} as const;
