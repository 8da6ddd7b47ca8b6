/**
 * The tolerances of src/channels, in one place. The Choi matrix is unnormalised (Tr J = d
 * for a trace-preserving map, see ./conventions.ts), so its entries and eigenvalues are of
 * order 1 and the tolerances are absolute.
 */

/**
 * Deviation allowed before a physicality property fails: ‖J − J†‖ (Hermiticity preserving),
 * −λ_min(J) (completely positive), ‖Tr_out J − I‖ (trace preserving), ‖Tr_in J − I‖ (unital),
 * all in the spectral norm. Matches the 1e-9 the circuit format allows for unitarity and trace
 * preservation of user matrices (src/format/customChannels.ts).
 */
export const PHYSICALITY_TOLERANCE = 1e-9;

/** Choi eigenvalues at or below this count as zero: they give no Kraus operator and do not add to the Kraus rank. */
export const KRAUS_EIGENVALUE_TOLERANCE = 1e-12;

/** Relative size of Tr(K_i†K_j) (i ≠ j) under which given Kraus operators count as mutually orthogonal. */
export const KRAUS_ORTHOGONALITY_TOLERANCE = 1e-12;

/** Largest entry of K†K − I (after scaling the single Kraus operator to unit norm) for a channel to count as unitary. */
export const UNITARY_CHANNEL_TOLERANCE = 1e-9;
