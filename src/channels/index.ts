/** The channel library of fray: one value for every representation, checks, minimal Kraus form, metrics. */
export { CHANNEL_FORMS, MAX_CHANNEL_QUBITS, qubitsOfDim, type ChannelForm } from './conventions.js';
export { Channel, type GivenForm } from './channel.js';
export { krausToChoi, choiToSuperoperator, superoperatorToChoi, traceInput, traceOutput, vec, unvec } from './choi.js';
export { pauliBasis, ptmToSuperoperator, superoperatorToPtm } from './ptm.js';
export { krausToStinespring, stinespringToKraus } from './stinespring.js';
export { hermitianEigen, hermitianEigenvalues, type HermitianEigen } from '../linalg/hermitianEigen.js';
export { choiToMinimalKraus, orthogonalKraus, fixPhase, NotCompletelyPositiveError } from './minimalKraus.js';
export * from './builtins.js';
export { sequence } from './sequence.js';
export { parallel } from './parallel.js';
export { checkPhysicality, type Physicality, type PositivityCheck, type PropertyCheck } from './physicality.js';
export { searchMinOutputEigenvalue, type PositivitySearch } from './positivity.js';
export { nearestCptp, NEAREST_CPTP_METHOD, type CptpRepair } from './nearestCptp.js';
export { diamondDistance, unitaryDiamondDistance, unitaryEigenvalues, type DiamondDistance, type DiamondMethod, type DiamondOptions } from './diamond.js';
export {
  averageGateFidelity,
  channelMetrics,
  choiStateFidelity,
  pauliErrorProbabilities,
  processFidelityToUnitary,
  unitarity,
  type ChannelMetrics,
  type MetricsTarget,
  type PauliError,
} from './metrics.js';
export { PHYSICALITY_TOLERANCE, KRAUS_EIGENVALUE_TOLERANCE, KRAUS_ORTHOGONALITY_TOLERANCE, UNITARY_CHANNEL_TOLERANCE } from './tolerances.js';
export { frobeniusNorm, singularValues, spectralNorm, traceNorm } from './norms.js';
