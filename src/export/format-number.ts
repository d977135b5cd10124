/** Decimals every number of a CSV or JSON table is written with (1 nm, 1 ns, 1e-9 °). */
export const TABLE_DECIMALS = 9;

/**
 * The one number formatter of the tables: fixed decimals, '.' as decimal point, no thousands separator, no exponent,
 * no "-0". `Number.prototype.toFixed` is locale-independent, so the same number always gives the same bytes. Throws on
 * a number that is not finite or too large to write without an exponent (programmer misuse: tables hold finite data).
 */
export function formatNumber(x: number, decimals: number = TABLE_DECIMALS): string {
  if (!Number.isFinite(x) || Math.abs(x) >= 1e15) throw new Error(`formatNumber: cannot write ${x} in a table`);
  const text = x.toFixed(decimals);
  return /^-0\.?0*$/.test(text) ? text.slice(1) : text;
}
