import type { Point } from '../geometry/index.js';
import type { DrawingModel, DrawnPart, DrawnTelescoping } from './drawing-model.js';
import { DxfBuilder } from './dxf-builder.js';
import {
  boxOf,
  commonNotes,
  drawPart,
  mmText,
  NOTE_LAYERS,
  partLine,
  place,
  TEXT_HEIGHT_MM,
  writeNotes,
} from './drawing-notes.js';
import type { ThermalScale } from './thermal-scale.js';

/** Layers of a part drawing (and of the combined sheet), in plain words. */
export const PART_LAYERS = Object.freeze({
  outline: 'cut-outline',
  holes: 'pin-holes',
  marks: 'centre-marks',
  melt: 'melt-edge',
  labels: 'part-labels',
});

const LAYERS = [
  { name: PART_LAYERS.outline, colour: 7 },
  { name: PART_LAYERS.holes, colour: 1 },
  { name: PART_LAYERS.marks, colour: 8 },
  { name: PART_LAYERS.melt, colour: 5 },
  { name: PART_LAYERS.labels, colour: 3 },
  ...NOTE_LAYERS,
];

/** Gap between a drawing's geometry and its notes, mm. */
const NOTE_GAP_MM = 10;

/** The ids of every part the drawings cut, in order: plates, telescoping halves, slider blocks, links. */
export function partIds(model: DrawingModel): string[] {
  return model.stations[0]!.parts.map((p) => p.id);
}

/**
 * One part to cut, as a DXF drawing: the closed cut outline exactly as the plan's clipping used it (the plate as the
 * first station places it, in the die-body frame, so each pin hole sits on its pivot's point), pin holes as circles,
 * centre marks, the melt edge on its own layer, and notes (part, stack layer, thickness, steel, units, cold or hot
 * dimensions, the safety cautions). Null for an unknown part id.
 */
export function writePartDxf(model: DrawingModel, partId: string, scale: ThermalScale): string | null {
  const part = model.stations[0]!.parts.find((p) => p.id === partId);
  if (!part) return null;
  const dxf = new DxfBuilder(LAYERS);
  drawPart(dxf, part, scale.factor, [0, 0], PART_LAYERS);
  const box = boxOf([part.outline.map((p) => place(p, scale.factor))]);
  labelPart(dxf, part, [box.minX, box.maxY + TEXT_HEIGHT_MM]);
  writeNotes(dxf, [box.minX, box.minY - NOTE_GAP_MM], partNotes(part, model, scale), model);
  return dxf.write();
}

/** What a part drawing says about its part. */
export function partNotes(part: DrawnPart, model: DrawingModel, scale: ThermalScale): string[] {
  const station = model.stations[0]!;
  return [
    `Part ${partLine(part, model)}.`,
    `Schedule ${model.scheduleName}; die runs ${model.polymer} at ${Math.round(model.dieTemperatureC)} deg C. Plate steel as the tool maker specifies (the expansion above is for H13 hot-work steel).`,
    `Placed as at station 1 (${mmText(station.positionM)} m along the line): pin hole centres are the plan's pivot points there. Melt edge (layer ${PART_LAYERS.melt}) faces the melt: keep it sharp and free of burrs.`,
    `Pin hole centres: ${part.holes.map((h) => `${h.joint} (${mmText(h.centre[0] * scale.factor)}, ${mmText(h.centre[1] * scale.factor)})`).join(', ')}${spacing(part, scale.factor)}.`,
    part.exactOutline
      ? "Cut outline: the plate outline the plan clips the die opening with, built on the plan's pivots."
      : part.kind === 'plate'
        ? 'Cut outline: the plate outline the plan clips with, widened by a boss round a link pin (as the clearance checks draw it).'
        : `Cut outline: ${outlineWords(part, model, scale.factor)}.`,
    ...commonNotes(model, scale),
  ];
}

/** Centre-to-centre distance of the first two pin holes, as a clause. */
function spacing(part: DrawnPart, factor: number): string {
  const [a, b] = part.holes;
  if (!a || !b) return '';
  return `; ${a.joint} to ${b.joint} ${mmText(Math.hypot(b.centre[0] - a.centre[0], b.centre[1] - a.centre[1]) * factor)} mm apart`;
}

function outlineWords(part: DrawnPart, model: DrawingModel, factor: number): string {
  switch (part.kind) {
    case 'link':
      return 'a link of the steel width the clearance checks use, round ends on its pin centres';
    case 'slider block':
      return 'a block that runs in the die-body slot, its pin hole in the middle';
    default: {
      const pair = model.telescoping.find((t) => part.id === t.plate || part.id === `${t.plate}_slide`);
      return pair ? telescopingWords(pair, part.id, factor) : 'one half of a telescoping pair';
    }
  }
}

/**
 * What a drawing says about a telescoping half (`half`, or either half when null): its length, the overlap of the
 * melt edges at the longest station and where its end meets the other half's pin at the shortest.
 */
export function telescopingWords(pair: DrawnTelescoping, half: string | null, factor: number): string {
  const mm = (v: number) => mmText(v * factor);
  const clash = half === null ? pair.clashes.length > 0 : pair.clashes.includes(half);
  const reach =
    pair.reachPastPinMm > 0
      ? `at the shortest its end reaches ${mm(pair.reachPastPinMm)} mm past the edge of the other half's pin hole, ${clash ? `IN A LAYER THAT PIN PASSES THROUGH (${pair.clashes.join(', ')}): it would hit the pin; change the stack or the pin before cutting` : 'in a layer that pin does not pass through'}`
      : `at the shortest its end stops ${mm(-pair.reachPastPinMm)} mm short of the other half's pin hole`;
  return `one half of telescoping ${pair.plate}, ${mm(pair.halfLengthMm)} mm from its pivot to its far end's centre (the pivots are ${mm(pair.pivotsApartMm.min)} to ${mm(pair.pivotsApartMm.max)} mm apart over the stations), so the two halves' melt edges overlap ${mm(pair.overlapAtLongestMm)} mm at the longest; ${reach}. Guide and seal the slide as the tool maker sees fit`;
}

/** A label of a part placed at `at`: its id and stack layer. */
export function labelPart(dxf: DxfBuilder, part: DrawnPart, at: Point): void {
  dxf.text(PART_LAYERS.labels, at, TEXT_HEIGHT_MM, `${part.id} (layer ${part.stackLayer})`);
}
