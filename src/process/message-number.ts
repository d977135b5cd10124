/**
 * Numbers for messages a process engineer reads, rounded to what the inputs support: three significant figures
 * (drawn geometry, handbook densities and power-law constants are seldom known better than that), trailing zeros
 * dropped, five digits and more grouped in thousands with a space ("37 200", "0.998", "1.58", "1.3"). Never for wire fields: those go through the HTTP layer's own
 * formatter.
 *
 * @param x  any finite number; non-finite values are written as they are.
 * @param significant  significant figures, 1–6; default 3.
 */
export function messageNumber(x: number, significant = 3): string {
  if (!Number.isFinite(x)) return String(x);
  if (Math.abs(x) < Number.MIN_VALUE) return '0';
  const rounded = Number(x.toPrecision(significant));
  const decimals = Math.max(0, significant - 1 - Math.floor(Math.log10(Math.abs(rounded))));
  const [whole = '', rawFraction = ''] = rounded.toFixed(decimals).split('.');
  const fraction = rawFraction.replace(/0+$/, '');
  const sign = whole.startsWith('-') ? '-' : '';
  const digits = sign ? whole.slice(1) : whole;
  const grouped = digits.length > 4 ? digits.replace(/\B(?=(\d{3})+(?!\d))/g, ' ') : digits;
  return `${sign}${grouped}${fraction ? `.${fraction}` : ''}`;
}

/** Above this a ratio is written as "more than 1000×": its exact size carries no meaning for the advice. */
export const RATIO_TEXT_CEILING = 1000;

/**
 * A ratio for messages: "about 8.45×", or "more than 1000×" above {@link RATIO_TEXT_CEILING} (power-law ratios grow
 * so steeply with the wall ratio that their digits are noise there).
 */
export function ratioText(ratio: number): string {
  if (ratio > RATIO_TEXT_CEILING) return `more than ${RATIO_TEXT_CEILING}×`;
  return `about ${messageNumber(ratio)}×`;
}
