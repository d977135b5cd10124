// @ts-check
/**
 * Words for what the drawing shows, for readers who cannot see it (the drawing's description) and for the page's
 * position readout. Pure: unit-tested in tests/web/describe.test.ts.
 */

/** @typedef {import('./motion-model.js').Pose} Pose */

/**
 * A number with a fixed count of decimals and a real minus sign.
 * @param {number} value
 * @param {number} decimals
 */
export function fixed(value, decimals) {
  if (!Number.isFinite(value)) return '–';
  const text = value.toFixed(decimals);
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text.replace('-', '−');
}

/**
 * A number as a reader wants it: whole numbers whole, others to 4 significant figures, with a real minus sign.
 * @param {number} value
 */
export function brief(value) {
  if (!Number.isFinite(value)) return '–';
  const text = Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(4)));
  return text.replace('-', '−');
}

/**
 * One sentence per part: the line position, each actuator's value, and each plate's pivots and angle, mm and degrees
 * in the die-body frame.
 * @param {Pose} pose
 */
export function describePose(pose) {
  const parts = [`At ${fixed(pose.position, 3)} m of line.`];
  for (const a of pose.actuators)
    parts.push(`${a.id} at ${fixed(a.value, a.unit === 'deg' ? 1 : 2)} ${a.unit === 'deg' ? '°' : 'mm'}.`);
  for (const p of pose.plates) {
    const [a, b] = p.pivots;
    const angle = (Math.atan2(b[1] - a[1], b[0] - a[0]) * 180) / Math.PI;
    parts.push(
      `${p.id} from (${fixed(a[0], 1)}, ${fixed(a[1], 1)}) to (${fixed(b[0], 1)}, ${fixed(b[1], 1)}) mm, at ${fixed(angle, 1)}°.`,
    );
  }
  for (const l of pose.links) {
    const [a, b] = l.pins;
    parts.push(`${l.id} from (${fixed(a[0], 1)}, ${fixed(a[1], 1)}) to (${fixed(b[0], 1)}, ${fixed(b[1], 1)}) mm.`);
  }
  return parts.join(' ');
}
