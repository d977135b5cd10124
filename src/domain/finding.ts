/**
 * A flagged design problem: expected, not a bug. Findings travel with every check and plan so that the process
 * engineer sees what is wrong, where, by how much and what to do.
 */
export interface Finding {
  /** Stable upper-case code, listed in api-spec/errors.md. */
  readonly code: string;
  readonly severity: FindingSeverity;
  /** Station index in schedule order, when the finding belongs to one station. */
  readonly station?: number;
  /** Line position of that station, m; for a finding along the motion, where the broken limit starts. */
  readonly positionM?: number;
  /** For a finding along the motion: where the broken limit ends, m (the range is positionM … toPositionM). */
  readonly toPositionM?: number;
  /** The measured value, in the unit the message names. */
  readonly value?: number;
  /** The limit it was compared with, same unit. */
  readonly limit?: number;
  /** Where in the die-body frame, mm, when the problem has a place. */
  readonly at?: readonly [x: number, y: number];
  /** What is wrong and what would help, in a sentence or two. */
  readonly message: string;
}

export type FindingSeverity = 'info' | 'warning' | 'error';
