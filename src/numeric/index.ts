export { type Tolerances, DEFAULT_TOLERANCES, nearlyEqual } from './tolerances.js';
export { RAD_PER_DEG, toRadians, toDegrees, wrapAngle, safeAcos } from './angles.js';
