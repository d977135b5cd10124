import { h, s } from './dom.js';
import { findingsAt } from './lib/charts.js';
import { describePose, fixed } from './lib/describe.js';
import { boundsOf } from './lib/geometry.js';
import { nearestStation, poseAt } from './lib/motion-model.js';

/** @typedef {import('./lib/motion-model.js').MotionModel} MotionModel */
/** @typedef {import('./lib/motion-model.js').Pose} Pose */
/** @typedef {import('./lib/geometry.js').Point} Point */

/**
 * The die drawn in its own frame (mm, y up): the orifices of all stations as the opening the plates close, the target
 * orifice of the nearest station dashed, the plates by layer, the links, every pin and the ground pivots. Every moving
 * part carries its die-body coordinates as data attributes (`data-x`, `data-y` on pins; `data-a-x` … on plates and
 * links), rounded to 0.1 µm, so what is drawn can be read back.
 * Findings with a place in the die are marked there (a ring in the severity's colour) while the line position is
 * within their range, or within `toleranceM` of their station.
 * @param {MotionModel} model
 * @param {any} plan  `GET /v1/plans/{id}`
 * @param {number} toleranceM
 * @returns {{ element: HTMLElement, update: (pose: Pose) => void }}
 */
export function createDrawing(model, plan, toleranceM) {
  const box = drawingBounds(model, plan);
  const size = Math.max(box.maxX - box.minX, box.maxY - box.minY, 1);
  const pad = 0.06 * size + 2;
  const minX = box.minX - pad;
  const minY = box.minY - pad;
  const width = box.maxX - box.minX + 2 * pad;
  const height = box.maxY - box.minY + 2 * pad;
  const e = plan.chain?.edge_offset_mm ?? size / 40;
  const pinR = Math.max(0.6, 0.4 * e);
  const font = Math.max(2, size / 38);

  const desc = s('desc', { id: 'drawing-desc' });
  const svg = s('svg', {
    class: 'die-drawing',
    viewBox: `${minX} ${-(minY + height)} ${width} ${height}`,
    role: 'img',
    'aria-labelledby': 'drawing-title',
    'aria-describedby': 'drawing-desc',
    preserveAspectRatio: 'xMidYMid meet',
  });
  svg.append(
    s('title', { id: 'drawing-title' }, 'The die at the chosen line position: plates, links, pins and ground pivots'),
    desc,
  );
  const world = s('g', { transform: 'scale(1,-1)' });
  svg.append(world);
  world.append(s('rect', { class: 'die-body', x: minX, y: minY, width, height }));
  const opening = s('g', { class: 'opening' });
  for (const station of plan.stations ?? []) opening.append(s('path', { d: regionPath(station.target_orifice) }));
  world.append(opening);
  const target = s('path', { class: 'target', d: '' });
  world.append(target);

  const plateEls = new Map();
  const plates = s('g', { class: 'plates' });
  for (const plate of [...model.plates].sort((a, b) => a.layer - b.layer)) {
    const el = s('polygon', {
      class: `plate layer-${plate.layer % 4}${plate.approximate ? ' approximate' : ''}`,
      'data-plate': plate.id,
      'data-layer': plate.layer,
    });
    plateEls.set(plate.id, el);
    plates.append(el);
  }
  world.append(plates);
  const linkEls = new Map();
  const links = s('g', { class: 'links' });
  for (const link of model.links) {
    const el = s('line', { class: 'link', 'data-link': link.id, 'stroke-width': 1.2 * pinR });
    linkEls.set(link.id, el);
    links.append(el);
  }
  world.append(links);
  const actuated = new Set(model.actuators.map((a) => a.joint).filter(Boolean));
  const pinEls = new Map();
  const groundEls = new Map();
  const pins = s('g', { class: 'pins' });
  for (const joint of model.joints) {
    if (joint.ground) {
      const g = s('path', { class: 'ground', 'data-ground': joint.id });
      groundEls.set(joint.id, g);
      pins.append(g);
    }
    if (actuated.has(joint.id)) {
      const ring = s('circle', { class: 'actuated', r: pinR * 2.2, 'data-actuated': joint.id });
      groundEls.set(`${joint.id}#ring`, ring);
      pins.append(ring);
    }
    const el = s('circle', { class: joint.ground ? 'pin ground-pin' : 'pin', r: pinR, 'data-joint': joint.id });
    pinEls.set(joint.id, el);
    pins.append(el);
  }
  world.append(pins);
  const findingMarks = s('g', { class: 'finding-marks' });
  world.append(findingMarks);

  const labels = s('g', { class: 'labels', 'font-size': font });
  const plateLabels = new Map();
  for (const plate of model.plates) {
    const t = s('text', { class: 'plate-label', 'text-anchor': 'middle' }, plate.id.replace('plate_', 'P'));
    plateLabels.set(plate.id, t);
    labels.append(t);
  }
  const bar = niceLength(width / 5);
  const bx = minX + pad * 0.5;
  const by = -(minY + pad * 0.35);
  labels.append(
    s('line', { class: 'scale-bar', x1: bx, y1: by, x2: bx + bar, y2: by }),
    s('text', { x: bx + bar / 2, y: by - font * 0.4, 'text-anchor': 'middle' }, `${bar} mm`),
  );
  const targetLabel = s('text', { class: 'target-label', x: minX + width - pad * 0.3, y: by, 'text-anchor': 'end' });
  labels.append(targetLabel);
  svg.append(labels);

  const legend = h(
    'ul',
    { class: 'legend', 'aria-label': 'what the drawing shows' },
    h('li', null, h('span', { class: 'key key-opening' }), 'orifice at the stations (melt)'),
    h('li', null, h('span', { class: 'key key-target' }), 'target orifice of the nearest station'),
    h(
      'li',
      null,
      h('span', { class: 'key key-plate' }),
      model.plates.some((p) => p.approximate) ? 'plate (pivot bar, shape not given)' : 'plate',
    ),
    model.links.length ? h('li', null, h('span', { class: 'key key-link' }), 'link') : null,
    h('li', null, h('span', { class: 'key key-pin' }), 'pin'),
    model.joints.some((j) => j.ground)
      ? h('li', null, h('span', { class: 'key key-ground' }), 'ground pivot (die body)')
      : null,
    actuated.size ? h('li', null, h('span', { class: 'key key-actuated' }), 'driven joint') : null,
    (plan.findings ?? []).some((/** @type {any} */ f) => f.at_mm)
      ? h('li', null, h('span', { class: 'key key-finding' }), 'finding at this line position')
      : null,
  );
  const element = h('div', { class: 'drawing' }, svg, legend);

  const stationTargets = (plan.stations ?? []).map((/** @type {any} */ st) => regionPath(st.target_orifice));
  /** @param {Pose} pose */
  const update = (pose) => {
    for (const plate of pose.plates) {
      const el = plateEls.get(plate.id);
      if (!el) continue;
      el.setAttribute('points', plate.outline.map((p) => `${p[0]},${p[1]}`).join(' '));
      setPair(el, 'a', plate.pivots[0]);
      setPair(el, 'b', plate.pivots[1]);
      const label = plateLabels.get(plate.id);
      if (label) {
        const cx = plate.outline.reduce((sum, p) => sum + p[0], 0) / plate.outline.length;
        const cy = plate.outline.reduce((sum, p) => sum + p[1], 0) / plate.outline.length;
        label.setAttribute('x', String(cx));
        label.setAttribute('y', String(-cy + font * 0.35));
      }
    }
    for (const link of pose.links) {
      const el = linkEls.get(link.id);
      if (!el) continue;
      const [a, b] = link.pins;
      el.setAttribute('x1', String(a[0]));
      el.setAttribute('y1', String(a[1]));
      el.setAttribute('x2', String(b[0]));
      el.setAttribute('y2', String(b[1]));
      setPair(el, 'a', a);
      setPair(el, 'b', b);
    }
    for (const [id, p] of Object.entries(pose.joints)) {
      const el = pinEls.get(id);
      if (el) {
        el.setAttribute('cx', String(p[0]));
        el.setAttribute('cy', String(p[1]));
        el.setAttribute('data-x', round4(p[0]));
        el.setAttribute('data-y', round4(p[1]));
      }
      const g = groundEls.get(id);
      if (g) {
        const r = pinR;
        g.setAttribute(
          'd',
          `M${p[0]},${p[1]} L${p[0] - 1.8 * r},${p[1] - 2.6 * r} L${p[0] + 1.8 * r},${p[1] - 2.6 * r} Z M${p[0] - 2.6 * r},${p[1] - 2.6 * r} L${p[0] + 2.6 * r},${p[1] - 2.6 * r}`,
        );
      }
      const ring = groundEls.get(`${id}#ring`);
      if (ring) {
        ring.setAttribute('cx', String(p[0]));
        ring.setAttribute('cy', String(p[1]));
      }
    }
    const near = nearestStation(model, pose.position);
    target.setAttribute('d', stationTargets[near] ?? '');
    targetLabel.textContent = `dashed: target of station ${near} (${fixed(model.stationPositions[near] ?? 0, 3)} m)`;
    const here = findingsAt(plan.findings ?? [], model.stationPositions, pose.position, toleranceM);
    findingMarks.replaceChildren(
      ...here.map((f) =>
        s(
          'circle',
          {
            class: `finding-mark severity-${f.severity}`,
            cx: f.at[0],
            cy: f.at[1],
            r: pinR * 1.6,
            'data-finding': f.finding,
          },
          s('title', null, f.code),
        ),
      ),
    );
    const notes = here.map((f) => `${f.code} at (${fixed(f.at[0], 1)}, ${fixed(f.at[1], 1)}) mm.`);
    desc.textContent = [describePose(pose), ...(notes.length ? ['Findings here:', ...notes] : [])].join(' ');
  };
  const first = model.positions[0];
  if (first !== undefined) update(poseAt(model, first));
  return { element, update };
}

/**
 * @param {Element} el
 * @param {string} end
 * @param {Point} p
 */
function setPair(el, end, p) {
  el.setAttribute(`data-${end}-x`, round4(p[0]));
  el.setAttribute(`data-${end}-y`, round4(p[1]));
}

/** @param {number} v */
function round4(v) {
  return String(Math.round(v * 1e4) / 1e4);
}

/**
 * A region as one SVG path (outer ring and holes, drawn even-odd).
 * @param {{ outer: Point[], holes?: Point[][] } | undefined} region
 */
export function regionPath(region) {
  if (!region) return '';
  const ring = (/** @type {Point[]} */ r) => (r.length ? `M${r.map((p) => `${p[0]},${p[1]}`).join('L')}Z` : '');
  return [ring(region.outer), ...(region.holes ?? []).map(ring)].join('');
}

/**
 * A round length near `approx`: 1, 2 or 5 times a power of ten.
 * @param {number} approx
 */
function niceLength(approx) {
  const p = 10 ** Math.floor(Math.log10(Math.max(approx, 1e-6)));
  const m = approx / p;
  // a hair below 5 or 2 (0.005 / 0.001 = 4.999…) counts as 5 or 2
  return (m >= 5 - 1e-9 ? 5 : m >= 2 - 1e-9 ? 2 : 1) * p;
}

/**
 * Box round everything the drawing will show over the whole motion (joints, plate outlines, station orifices).
 * @param {MotionModel} model
 * @param {any} plan
 */
function drawingBounds(model, plan) {
  /** @type {Point[]} */
  const points = [];
  for (const joint of model.joints) points.push(...joint.positions);
  const n = model.positions.length;
  const step = Math.max(1, Math.floor(n / 24));
  for (let i = 0; i < n; i += step) {
    for (const plate of poseAt(model, model.positions[i] ?? 0).plates) points.push(...plate.outline);
  }
  for (const station of plan.stations ?? []) points.push(...(station.target_orifice?.outer ?? []));
  return boundsOf(points) ?? { minX: 0, minY: 0, maxX: 10, maxY: 10 };
}
