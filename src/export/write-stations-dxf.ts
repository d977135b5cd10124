import type { Point } from '../geometry/index.js';
import type { DrawingModel } from './drawing-model.js';
import { DxfBuilder, type DxfLayer } from './dxf-builder.js';
import { boxOf, commonNotes, mmText, NOTE_LAYERS, place, writeNotes } from './drawing-notes.js';
import type { ThermalScale } from './thermal-scale.js';

/** Layer names of station `i` (0-based): target orifice, achieved orifice, plates in place. */
export function stationLayers(i: number): { target: string; achieved: string; parts: string } {
  const n = i + 1;
  return { target: `station-${n}-target`, achieved: `station-${n}-achieved`, parts: `station-${n}-parts` };
}

/**
 * Every station in place in the die-body frame, each on its own layers (switch them on one station at a time): the
 * target orifice, the achieved orifice (die opening minus the plates where the driven mechanism puts them) and the
 * parts at that station with their pin holes; the die opening on a layer of its own; notes with each station's
 * deviation, and the cautions.
 */
export function writeStationsDxf(model: DrawingModel, scale: ThermalScale): string {
  const f = scale.factor;
  const at = (p: Point) => place(p, f);
  const layers: DxfLayer[] = [{ name: 'die-opening', colour: 8 }];
  model.stations.forEach((_, i) => {
    const names = stationLayers(i);
    layers.push({ name: names.target, colour: 3 });
    layers.push({ name: names.achieved, colour: 1 });
    layers.push({ name: names.parts, colour: 5 });
  });
  const dxf = new DxfBuilder([...layers, ...NOTE_LAYERS]);
  dxf.polyline('die-opening', model.opening.outer.map(at), true);
  const rings: Point[][] = [model.opening.outer.map(at)];
  const lines: string[] = [`STATIONS: ${model.scheduleName}, ${model.stations.length} station(s) in place.`];
  model.stations.forEach((s, i) => {
    const names = stationLayers(i);
    for (const ring of [s.target.outer, ...s.target.holes]) dxf.polyline(names.target, ring.map(at), true);
    if (s.achieved.outer.length >= 3) {
      for (const ring of [s.achieved.outer, ...s.achieved.holes]) dxf.polyline(names.achieved, ring.map(at), true);
    }
    for (const part of s.parts) {
      const outline = part.outline.map(at);
      rings.push(outline);
      dxf.polyline(names.parts, outline, true);
      for (const h of part.holes) dxf.circle(names.parts, at(h.centre), h.diameterMm * f);
    }
    lines.push(
      `Station ${i + 1} at ${mmText(s.positionM)} m: layers ${names.target}, ${names.achieved}, ${names.parts}; deviation ${mmText(s.deviationMm)} mm (target vs achieved boundary, Hausdorff).`,
    );
  });
  const box = boxOf(rings);
  writeNotes(dxf, [box.minX, box.minY - 10], [...lines, ...commonNotes(model, scale)], model);
  return dxf.write();
}
