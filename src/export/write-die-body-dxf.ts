import type { Point } from '../geometry/index.js';
import { type DrawingModel, SLOT_FIT_CLEARANCE_MM } from './drawing-model.js';
import { DxfBuilder } from './dxf-builder.js';
import { boxOf, commonNotes, mmText, NOTE_LAYERS, place, TEXT_HEIGHT_MM, writeNotes } from './drawing-notes.js';
import { formatNumber } from './format-number.js';
import type { ThermalScale } from './thermal-scale.js';

/** Layers of the die-body drawing, in plain words. */
export const DIE_BODY_LAYERS = Object.freeze({
  opening: 'die-opening',
  holes: 'die-body-pin-holes',
  marks: 'centre-marks',
  slots: 'slot-paths',
  actuators: 'actuator-mounts',
  swept: 'swept-by-moving-parts',
  labels: 'die-body-labels',
});

const LAYERS = [
  { name: DIE_BODY_LAYERS.opening, colour: 7 },
  { name: DIE_BODY_LAYERS.holes, colour: 1 },
  { name: DIE_BODY_LAYERS.marks, colour: 8 },
  { name: DIE_BODY_LAYERS.slots, colour: 4 },
  { name: DIE_BODY_LAYERS.actuators, colour: 6 },
  { name: DIE_BODY_LAYERS.swept, colour: 30 },
  { name: DIE_BODY_LAYERS.labels, colour: 3 },
  ...NOTE_LAYERS,
];

/**
 * The die body as the plan needs it: the fixed opening the plates close (the envelope of every station), the die-body
 * pin holes (ground pivots of the chain and of links) with centre marks and labels, slots (the pin's travel and the
 * pocket the slider block runs in, with a sliding clearance), actuator mounts (a ring three hole diameters across round the actuated joint, with its
 * range), and the area swept by every moving part over the stations and the steps between them (keep the die body's
 * own steel, bolts and guards out of it). Notes and cautions below.
 */
export function writeDieBodyDxf(model: DrawingModel, scale: ThermalScale): string {
  const dxf = new DxfBuilder(LAYERS);
  const f = scale.factor;
  const at = (p: Point) => place(p, f);
  const rings = [model.opening.outer, ...model.opening.holes];
  for (const ring of rings) dxf.polyline(DIE_BODY_LAYERS.opening, ring.map(at), true);
  for (const region of model.sweptEnvelope) {
    for (const ring of [region.outer, ...region.holes]) dxf.polyline(DIE_BODY_LAYERS.swept, ring.map(at), true);
  }
  for (const h of model.groundHoles) {
    const c = at(h.centre);
    const d = h.diameterMm * f;
    dxf.circle(DIE_BODY_LAYERS.holes, c, d);
    dxf.line(DIE_BODY_LAYERS.marks, [c[0] - 0.75 * d, c[1]], [c[0] + 0.75 * d, c[1]]);
    dxf.line(DIE_BODY_LAYERS.marks, [c[0], c[1] - 0.75 * d], [c[0], c[1] + 0.75 * d]);
    dxf.text(DIE_BODY_LAYERS.labels, [c[0] + d, c[1] + d], TEXT_HEIGHT_MM, h.joint);
  }
  for (const s of model.slots) {
    const a = at(s.from);
    const b = at(s.to);
    dxf.line(DIE_BODY_LAYERS.slots, a, b);
    dxf.polyline(DIE_BODY_LAYERS.slots, pocketOutline(a, b, s.direction, s.lengthMm * f, s.widthMm * f), true);
    dxf.text(
      DIE_BODY_LAYERS.labels,
      [b[0] + s.widthMm, b[1]],
      TEXT_HEIGHT_MM,
      `${s.joint}: pin travel ${mmText(Math.hypot(b[0] - a[0], b[1] - a[1]))} mm`,
    );
  }
  const actuatorLines: string[] = [];
  for (const a of model.actuators) {
    const c = at(a.at);
    if (a.onDieBody) dxf.circle(DIE_BODY_LAYERS.actuators, c, 3 * model.holeDiameterMm * f);
    const unit = a.kind === 'rotary' ? 'deg' : 'mm';
    const lo = Math.min(...a.stationValues);
    const hi = Math.max(...a.stationValues);
    const line = `${a.id}: ${a.kind} on joint ${a.joint} (${a.onDieBody ? `die body to ${a.drives}` : `rides on the plates, turns ${a.drives}`}), ${formatNumber(lo, 2)} to ${formatNumber(hi, 2)} ${unit} over the stations`;
    dxf.text(
      DIE_BODY_LAYERS.actuators,
      [c[0] + 2 * model.holeDiameterMm, c[1] - 2 * model.holeDiameterMm],
      TEXT_HEIGHT_MM,
      a.id,
    );
    actuatorLines.push(line);
  }
  const slotLines = model.slots.map(
    (s) =>
      `${s.joint}: pocket ${mmText(s.lengthMm * f)} x ${mmText(s.widthMm * f)} mm for the slider block (its travel plus its length, its width, each + ${mmText(SLOT_FIT_CLEARANCE_MM)} mm sliding clearance); relieve the corners for the cutter.`,
  );
  const box = boxOf([...rings, ...model.sweptEnvelope.map((r) => r.outer)].map((r) => r.map(at)));
  writeNotes(
    dxf,
    [box.minX, box.minY - 10],
    [
      `DIE BODY: ${model.scheduleName}. Fixed opening (layer ${DIE_BODY_LAYERS.opening}); die-body pin holes; slots; actuator mounts; area swept by the moving parts (layer ${DIE_BODY_LAYERS.swept}): ${model.sweepNote}. Keep die-body steel, bolts and guards clear of the swept area.`,
      ...slotLines,
      ...(actuatorLines.length > 0 ? actuatorLines : ['No actuators: the plan found no way to drive the chain.']),
      ...commonNotes(model, scale),
    ],
    model,
  );
  return dxf.write();
}

/**
 * A slot's pocket: a rectangle `length` × `width` centred on the middle of the pin's travel a–b, its length along the
 * unit vector `u`, counter-clockwise.
 */
function pocketOutline(a: Point, b: Point, u: Point, length: number, width: number): Point[] {
  const m: Point = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
  const v: Point = [-u[1], u[0]];
  const corner = (s: number, t: number): Point => [
    m[0] + (s * length * u[0]) / 2 + (t * width * v[0]) / 2,
    m[1] + (s * length * u[1]) / 2 + (t * width * v[1]) / 2,
  ];
  return [corner(-1, -1), corner(1, -1), corner(1, 1), corner(-1, 1)];
}
