export type { Point, Ring, Polyline, Region } from './types.js';
