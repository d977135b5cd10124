/** A process-safety caution carried by every check, plan and export. */
export interface Caution {
  /** Stable upper-case code. */
  readonly code: string;
  /** The hazard in a few words (e.g. "hot melt and die surfaces"). */
  readonly hazard: string;
  /** What to watch, deferring to local codes, the machine builder's instructions and plant practice. */
  readonly message: string;
}
