import { type BoundingBox, boundingBox, type Point, type Ring } from '../geometry/index.js';
import type { DrawingModel, DrawnPart } from './drawing-model.js';
import { type DxfBuilder, wrapText } from './dxf-builder.js';
import { formatNumber } from './format-number.js';
import type { ThermalScale } from './thermal-scale.js';

/** Height of labels and notes on every drawing, mm (on paper at 1:1). */
export const TEXT_HEIGHT_MM = 2.5;

/** Characters per line of a wrapped note. */
const NOTE_WIDTH = 110;

/** Layers every drawing has: its notes and its cautions. */
export const NOTE_LAYERS = [
  { name: 'notes', colour: 3 },
  { name: 'safety-cautions', colour: 1 },
] as const;

/** A length as drawings write it: 3 decimals, mm. */
export function mmText(x: number): string {
  return formatNumber(x, 3);
}

/** The lines every drawing carries under its title: units, dimensions (cold or hot), pin holes. */
export function commonNotes(model: DrawingModel, scale: ThermalScale): string[] {
  return [
    'Units: millimetres ($INSUNITS 4); die-body frame, y up, as the plan gives it.',
    scale.statement,
    `Pin holes dia ${mmText(model.holeDiameterMm * scale.factor)} mm: pin ${mmText(model.pinDiameterMm)} mm + ${mmText(model.holeDiameterMm - model.pinDiameterMm)} mm running clearance (sizes as drawn; scaled with the drawing).`,
  ];
}

/**
 * The plan's safety cautions as a text block (every drawing carries them), headed by what the drawing is not: it
 * plans geometry; the machine builder's instructions, local codes and plant practice decide.
 */
export function cautionLines(model: DrawingModel): string[] {
  const lines = [
    'SAFETY CAUTIONS (hot surfaces, melt pressure, moving parts and pinch points): this drawing plans geometry only;',
    "the machine builder's instructions and risk assessment, local codes and plant practice decide.",
  ];
  for (const c of model.cautions) lines.push(...wrapText(`- ${c.hazard}: ${c.message}`, NOTE_WIDTH));
  return lines;
}

/** Writes notes then cautions below `top` (left edge x). Returns the y below the last line. */
export function writeNotes(dxf: DxfBuilder, top: Point, notes: readonly string[], model: DrawingModel): number {
  const wrapped = notes.flatMap((line) => wrapText(line, NOTE_WIDTH));
  const y = dxf.textBlock('notes', top, TEXT_HEIGHT_MM, wrapped);
  return dxf.textBlock('safety-cautions', [top[0], y - TEXT_HEIGHT_MM], TEXT_HEIGHT_MM, cautionLines(model));
}

/** The point p of the plan scaled about the die-body origin and moved by `offset`. */
export function place(p: Point, factor: number, offset: Point = [0, 0]): Point {
  return [p[0] * factor + offset[0], p[1] * factor + offset[1]];
}

/** Bounding box of rings (geometry's boundingBox over all their points); infinite bounds when there are none. */
export function boxOf(rings: readonly Ring[]): BoundingBox {
  const points = rings.flat();
  if (points.length === 0) {
    return { minX: Infinity, minY: Infinity, maxX: -Infinity, maxY: -Infinity };
  }
  return boundingBox(points);
}

/** A part's description in words, one line: id, kind, stack layer, thickness, holes. */
export function partLine(part: DrawnPart, model: DrawingModel): string {
  return `${part.id}: ${part.kind}, stack layer ${part.stackLayer} of ${model.stackLayers}, ${mmText(model.plateThicknessMm)} mm thick, ${part.holes.length} pin hole(s)`;
}

/**
 * Draws one part: cut outline, pin holes with centre marks, melt edge; scaled by `factor` about the die-body origin,
 * then moved by `offset`.
 */
export function drawPart(
  dxf: DxfBuilder,
  part: DrawnPart,
  factor: number,
  offset: Point,
  layers: { outline: string; holes: string; marks: string; melt: string },
): void {
  dxf.polyline(
    layers.outline,
    part.outline.map((p) => place(p, factor, offset)),
    true,
  );
  for (const h of part.holes) {
    const c = place(h.centre, factor, offset);
    const d = h.diameterMm * factor;
    dxf.circle(layers.holes, c, d);
    // centre mark: a cross reaching a quarter diameter past the hole
    const r = 0.75 * d;
    dxf.line(layers.marks, [c[0] - r, c[1]], [c[0] + r, c[1]]);
    dxf.line(layers.marks, [c[0], c[1] - r], [c[0], c[1] + r]);
  }
  if (part.meltEdge) {
    dxf.polyline(
      layers.melt,
      part.meltEdge.map((p) => place(p, factor, offset)),
      false,
    );
  }
}
