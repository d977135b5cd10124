export { type Tolerances, DEFAULT_TOLERANCES, nearlyEqual } from './tolerances.js';
export { RAD_PER_DEG, toRadians, toDegrees, wrapAngle, safeAcos } from './angles.js';
export { BandLu } from './band-lu.js';
export { reverseCuthillMcKee } from './reverse-cuthill-mckee.js';
export * from './levenberg-marquardt.js';
export { interpolateLinear } from './interpolate-linear.js';
