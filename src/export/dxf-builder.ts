import Drawing from 'dxf-writer';
import Handle from 'dxf-writer/src/Handle.js';
import type { Point } from '../geometry/index.js';
import { formatNumber } from './format-number.js';

/** Decimals of every DXF coordinate and size: 1 nm. */
export const DXF_DECIMALS = 6;

/** A layer of our drawings: plain words, an AutoCAD colour index (ACI) colour. */
export interface DxfLayer {
  readonly name: string;
  /** ACI colour number 1–255. */
  readonly colour: number;
}

type Command =
  | { readonly kind: 'polyline'; readonly layer: string; readonly points: readonly Point[]; readonly closed: boolean }
  | { readonly kind: 'circle'; readonly layer: string; readonly centre: Point; readonly radius: number }
  | { readonly kind: 'line'; readonly layer: string; readonly a: Point; readonly b: Point }
  | {
      readonly kind: 'text';
      readonly layer: string;
      readonly at: Point;
      readonly height: number;
      readonly value: string;
    };

/**
 * Collects the entities of one DXF drawing (millimetres, `$INSUNITS` 4) and writes them with dxf-writer: LWPOLYLINE,
 * CIRCLE, LINE and TEXT on named layers. Every number is rounded to `DXF_DECIMALS` through `formatNumber` first (it
 * refuses NaN and infinities, which dxf-writer would write as text). dxf-writer numbers its handles from a counter
 * shared by every drawing in the process; `write` restarts it, builds and serialises the drawing in one synchronous
 * run, so the same entities give the same bytes whatever was drawn before.
 */
export class DxfBuilder {
  private readonly commands: Command[] = [];
  private readonly layerNames: Set<string>;

  constructor(private readonly layers: readonly DxfLayer[]) {
    this.layerNames = new Set(layers.map((l) => l.name));
  }

  polyline(layer: string, points: readonly Point[], closed: boolean): this {
    this.check(layer);
    if (points.length < 2) throw new Error('DxfBuilder.polyline: fewer than two points');
    this.commands.push({ kind: 'polyline', layer, points, closed });
    return this;
  }

  circle(layer: string, centre: Point, diameter: number): this {
    this.check(layer);
    if (!(diameter > 0)) throw new Error(`DxfBuilder.circle: diameter ${diameter}`);
    this.commands.push({ kind: 'circle', layer, centre, radius: diameter / 2 });
    return this;
  }

  line(layer: string, a: Point, b: Point): this {
    this.check(layer);
    this.commands.push({ kind: 'line', layer, a, b });
    return this;
  }

  /** One line of text, left-aligned on its baseline at `at`; written in plain ASCII (see `asciiText`). */
  text(layer: string, at: Point, height: number, value: string): this {
    this.check(layer);
    this.commands.push({ kind: 'text', layer, at, height, value: asciiText(value) });
    return this;
  }

  /** Lines of text downwards from `top` (the first baseline one height below it), 1.6 heights apart. Returns the y below. */
  textBlock(layer: string, top: Point, height: number, lines: readonly string[]): number {
    let y = top[1] - height;
    for (const line of lines) {
      this.text(layer, [top[0], y], height, line);
      y -= height * LINE_PITCH;
    }
    return y;
  }

  /** The DXF text (AutoCAD 2007 format as dxf-writer writes it, '\n' line ends). */
  write(): string {
    Handle.seed = 0;
    const d = new Drawing();
    d.setUnits('Millimeters');
    for (const l of this.layers) d.addLayer(l.name, l.colour, 'CONTINUOUS');
    for (const c of this.commands) {
      d.setActiveLayer(c.layer);
      switch (c.kind) {
        case 'polyline':
          d.drawPolyline(
            c.points.map((p) => [n(p[0]), n(p[1])]),
            c.closed,
          );
          break;
        case 'circle':
          d.drawCircle(n(c.centre[0]), n(c.centre[1]), n(c.radius));
          break;
        case 'line':
          d.drawLine(n(c.a[0]), n(c.a[1]), n(c.b[0]), n(c.b[1]));
          break;
        case 'text':
          d.drawText(n(c.at[0]), n(c.at[1]), n(c.height), 0, c.value);
          break;
      }
    }
    return `${d.toDxfString()}\n`;
  }

  private check(layer: string) {
    if (!this.layerNames.has(layer)) throw new Error(`DxfBuilder: unknown layer '${layer}'`);
  }
}

/** Distance between baselines of a text block, in text heights. */
export const LINE_PITCH = 1.6;

/** A coordinate as dxf-writer will print it: rounded to 1 nm, never NaN. */
function n(x: number): number {
  return Number(formatNumber(x, DXF_DECIMALS));
}

/**
 * Text as plain ASCII, so every reader shows it the same: dashes, quotes, the degree sign and other typography become
 * their ASCII words or signs, anything else a '?'.
 */
export function asciiText(value: string): string {
  return value
    .replace(/[–—]/g, '-')
    .replace(/[‘’]/g, "'")
    .replace(/[“”]/g, '"')
    .replace(/°/g, ' deg ')
    .replace(/×/g, 'x')
    .replace(/µ/g, 'u')
    .replace(/≤/g, '<=')
    .replace(/≥/g, '>=')
    .replace(/²/g, '2')
    .replace(/³/g, '3')
    .replace(/ⁿ/g, 'n')
    .replace(/·/g, '.')
    .replace(/ {2,}/g, ' ')
    .replace(/[^\x20-\x7e]/g, '?');
}

/** Words of a long sentence wrapped into lines of at most `width` characters. */
export function wrapText(text: string, width: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/)) {
    if (word === '') continue;
    if (line !== '' && line.length + 1 + word.length > width) {
      lines.push(line);
      line = word;
    } else line = line === '' ? word : `${line} ${word}`;
  }
  if (line !== '') lines.push(line);
  return lines;
}
