import { nearlyEqual } from '../numeric/index.js';
import type { FourBarDimensions } from './solve-four-bar-closed-form.js';

/** Barker's classes of the four-bar, as far as the crank (a) and rocker (c) of `FourBarDimensions` go. */
export type GrashofClass =
  | 'crank-rocker'
  | 'double-crank'
  | 'double-rocker'
  | 'rocker-crank'
  | 'triple-rocker'
  | 'change-point';

/** Result of `classifyGrashof`. */
export interface GrashofClassification {
  /** s + l < p + q: some link turns fully relative to the others. */
  readonly grashof: boolean;
  readonly kind: GrashofClass;
  /** Which link is shortest. */
  readonly shortest: 'a' | 'b' | 'c' | 'd';
  /** (s + l) − (p + q), mm: negative for Grashof linkages, zero at a change point. */
  readonly margin: number;
}

/**
 * Grashof's criterion and Barker's classification of a four-bar (Norton, *Design of Machinery*): with s the
 * shortest and l the longest link, s + l < p + q is Grashof and then the shortest link decides the class (ground →
 * double-crank, crank a → crank-rocker, coupler b → double-rocker, rocker c → rocker-crank); s + l > p + q is a
 * triple-rocker; equality (within `lengthToleranceMm`, relative to the lengths) is a change-point linkage.
 */
export function classifyGrashof(dims: FourBarDimensions, lengthToleranceMm = 1e-9): GrashofClassification {
  const named = [
    ['a', dims.a],
    ['b', dims.b],
    ['c', dims.c],
    ['d', dims.d],
  ] as const;
  const sorted = [...named].sort((x, y) => x[1] - y[1]);
  const [s, p, q, l] = sorted.map((e) => e[1]) as [number, number, number, number];
  const shortest = sorted[0]![0];
  const margin = s + l - (p + q);
  if (nearlyEqual(s + l, p + q, lengthToleranceMm)) {
    return { grashof: false, kind: 'change-point', shortest, margin };
  }
  if (margin > 0) return { grashof: false, kind: 'triple-rocker', shortest, margin };
  const kind: GrashofClass =
    shortest === 'd'
      ? 'double-crank'
      : shortest === 'a'
        ? 'crank-rocker'
        : shortest === 'b'
          ? 'double-rocker'
          : 'rocker-crank';
  return { grashof: true, kind, shortest, margin };
}
