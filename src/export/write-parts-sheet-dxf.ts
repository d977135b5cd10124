import type { Point } from '../geometry/index.js';
import type { DrawingModel, DrawnPart } from './drawing-model.js';
import { DxfBuilder } from './dxf-builder.js';
import {
  boxOf,
  commonNotes,
  drawPart,
  NOTE_LAYERS,
  partLine,
  place,
  TEXT_HEIGHT_MM,
  writeNotes,
} from './drawing-notes.js';
import type { ThermalScale } from './thermal-scale.js';
import { labelPart, PART_LAYERS, telescopingWords } from './write-part-dxf.js';

const LAYERS = [
  { name: PART_LAYERS.outline, colour: 7 },
  { name: PART_LAYERS.holes, colour: 1 },
  { name: PART_LAYERS.marks, colour: 8 },
  { name: PART_LAYERS.melt, colour: 5 },
  { name: PART_LAYERS.labels, colour: 3 },
  { name: 'parts-list', colour: 3 },
  ...NOTE_LAYERS,
];

/** Room between parts on the sheet, mm: more than a cutting kerf and a clamp. */
export const SHEET_GAP_MM = 10;

/** A row of the sheet is filled up to this width (or one part, when a part is wider), mm. */
export const SHEET_ROW_WIDTH_MM = 250;

/** Where each part goes on the sheet: the translation applied after scaling. */
export interface SheetPlacement {
  readonly part: DrawnPart;
  readonly offset: Point;
}

/**
 * Parts laid out in rows without rotation: each part's bounding box, with a label band under it, is placed left to
 * right with `SHEET_GAP_MM` between boxes until the row reaches `SHEET_ROW_WIDTH_MM`, and rows stack upwards. Boxes
 * that do not overlap hold parts that do not overlap.
 */
export function layoutSheet(parts: readonly DrawnPart[], factor: number): SheetPlacement[] {
  const band = TEXT_HEIGHT_MM * 2;
  const out: SheetPlacement[] = [];
  let x = 0;
  let rowBase = 0;
  let rowHeight = 0;
  for (const part of parts) {
    const box = boxOf([part.outline.map((p) => place(p, factor))]);
    const width = box.maxX - box.minX;
    const height = box.maxY - box.minY + band;
    if (x > 0 && x + width > SHEET_ROW_WIDTH_MM) {
      rowBase += rowHeight + SHEET_GAP_MM;
      x = 0;
      rowHeight = 0;
    }
    out.push({ part, offset: [x - box.minX, rowBase + band - box.minY] });
    x += width + SHEET_GAP_MM;
    rowHeight = Math.max(rowHeight, height);
  }
  return out;
}

/**
 * Every part of the plan on one sheet (as `writePartDxf` draws each, moved apart without overlap), each labelled, with
 * a parts list and the notes and cautions below.
 */
export function writePartsSheetDxf(model: DrawingModel, scale: ThermalScale): string {
  const dxf = new DxfBuilder(LAYERS);
  const parts = model.stations[0]!.parts;
  const placements = layoutSheet(parts, scale.factor);
  for (const { part, offset } of placements) {
    drawPart(dxf, part, scale.factor, offset, PART_LAYERS);
    const box = boxOf([part.outline.map((p) => place(p, scale.factor, offset))]);
    labelPart(dxf, part, [box.minX, box.minY - TEXT_HEIGHT_MM * 1.5]);
  }
  const list = [
    `PARTS LIST: ${model.scheduleName}, ${parts.length} part(s), each cut once, ${model.plateThicknessMm} mm steel`,
    ...parts.map((p, i) => `${i + 1}. ${partLine(p, model)}`),
  ];
  const below = dxf.textBlock('parts-list', [0, -SHEET_GAP_MM], TEXT_HEIGHT_MM, list);
  writeNotes(
    dxf,
    [0, below - TEXT_HEIGHT_MM],
    [
      `Parts placed as at station 1, moved apart for cutting (not rotated); ${SHEET_GAP_MM} mm or more between parts.`,
      ...model.telescoping.map(
        (t) => `${t.plate} and ${t.plate}_slide: each is ${telescopingWords(t, null, scale.factor)}.`,
      ),
      ...commonNotes(model, scale),
    ],
    model,
  );
  return dxf.write();
}
