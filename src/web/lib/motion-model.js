// @ts-check
/**
 * The plan's motion as the page draws it: joint positions, plates, links and actuator values against line position,
 * from the plan's motion download (`motion.json`, sampled densely) or, when a plan has none, from its stations.
 * Pure: no DOM, no fetch; unit-tested in tests/web/motion-model.test.ts.
 */
import { barOutline, lerpPoint, placeOutline, regionArea } from './geometry.js';

/** @typedef {import('./geometry.js').Point} Point */

/**
 * @typedef {object} Curve  values against line position
 * @property {number[]} positions  line positions, m, increasing
 * @property {(number | null)[]} values  null where a value does not exist (a gap)
 */

/**
 * @typedef {object} MotionModel
 * @property {'motion' | 'stations'} source  motion.json, or the plan's stations (pose between stations interpolated)
 * @property {number[]} positions  line positions of the samples, m, increasing
 * @property {Curve | null} clock  time (s) against line position, for playing the motion; null without a time base
 * @property {number[]} stationPositions  line positions of the stations, m
 * @property {{ id: string, ground: boolean, positions: Point[] }[]} joints  position in the die-body frame per sample, mm
 * @property {{ id: string, pivots: [string, string], outline: Point[], layer: number, approximate: boolean }[]} plates
 *   outline in the plate frame (origin first pivot, x toward the second), mm
 * @property {{ id: string, pins: [string, string], layer: number }[]} links
 * @property {{ id: string, kind: string, unit: string, joint: string | null, curve: Curve }[]} actuators
 * @property {Record<string, Curve & { atStations: boolean }>} series  process figures against line position
 * @property {Curve | null} fraction  between stations (source 'stations'): the curve whose share of its change from
 *   one station to the next moves the joints along (the first actuator that moves); null: in proportion to position
 * @property {Record<string, { min?: number, max?: number }>} limits  limits the series are held to, by series key
 *   (from motion.json; empty when drawn from the stations)
 */

/**
 * Index of the sample interval holding `x`: `positions[i] ≤ x ≤ positions[i + 1]`, clamped to the ends.
 * @param {readonly number[]} positions  increasing
 * @param {number} x
 */
export function intervalIndex(positions, x) {
  let lo = 0;
  let hi = positions.length - 1;
  if (hi <= 0) return 0;
  if (x <= (positions[0] ?? 0)) return 0;
  if (x >= (positions[hi] ?? 0)) return hi - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if ((positions[mid] ?? 0) <= x) lo = mid;
    else hi = mid;
  }
  return lo;
}

/**
 * Where `x` lies between samples: the interval and the share `t` (0–1) of the way along it, clamped to the ends.
 * @param {readonly number[]} positions
 * @param {number} x
 */
export function locate(positions, x) {
  const i = intervalIndex(positions, x);
  const a = positions[i] ?? 0;
  const b = positions[i + 1] ?? a;
  const t = b > a ? Math.min(1, Math.max(0, (x - a) / (b - a))) : 0;
  return { index: i, t };
}

/**
 * A curve's value at `x`, linear between samples, clamped to the ends.
 * @param {Curve} curve
 * @param {number} x
 */
export function valueAt(curve, x) {
  const { index, t } = locate(curve.positions, x);
  const a = finite(curve.values[index]);
  const b = index + 1 < curve.values.length ? finite(curve.values[index + 1]) : a;
  if (t === 0) return a;
  if (t === 1) return b;
  return a + (b - a) * t;
}

/**
 * A sample as a number: a missing one (null on the wire, e.g. the pressure ratio of a closed orifice) is NaN.
 * @param {number | null | undefined} v
 */
function finite(v) {
  return typeof v === 'number' ? v : Number.NaN;
}

/**
 * @typedef {object} Pose  the mechanism at one line position, die-body frame, mm
 * @property {number} position  line position, m (clamped to the motion's range)
 * @property {Record<string, Point>} joints
 * @property {{ id: string, layer: number, pivots: [Point, Point], outline: Point[], approximate: boolean }[]} plates
 * @property {{ id: string, layer: number, pins: [Point, Point] }[]} links
 * @property {{ id: string, unit: string, value: number }[]} actuators
 */

/**
 * The mechanism at line position `x`: joints interpolated between samples (between stations, along the share of the
 * moving actuator's change, see `MotionModel.fraction`), each plate's outline placed on its two pivots, links between
 * their pins.
 * @param {MotionModel} model
 * @param {number} x  line position, m
 * @returns {Pose}
 */
export function poseAt(model, x) {
  const first = model.positions[0] ?? 0;
  const last = model.positions[model.positions.length - 1] ?? first;
  const position = Math.min(last, Math.max(first, x));
  const { index, t } = locate(model.positions, position);
  const share = model.source === 'stations' ? stationShare(model, index, t, position) : t;
  /** @type {Record<string, Point>} */
  const joints = {};
  for (const joint of model.joints) {
    const a = joint.positions[index];
    const b = joint.positions[index + 1] ?? a;
    if (a && b) joints[joint.id] = lerpPoint(a, b, share);
  }
  const plates = [];
  for (const plate of model.plates) {
    const a = joints[plate.pivots[0]];
    const b = joints[plate.pivots[1]];
    if (!a || !b) continue;
    plates.push({
      id: plate.id,
      layer: plate.layer,
      pivots: /** @type {[Point, Point]} */ ([a, b]),
      outline: placeOutline(plate.outline, a, b),
      approximate: plate.approximate,
    });
  }
  const links = [];
  for (const link of model.links) {
    const a = joints[link.pins[0]];
    const b = joints[link.pins[1]];
    if (a && b) links.push({ id: link.id, layer: link.layer, pins: /** @type {[Point, Point]} */ ([a, b]) });
  }
  const actuators = model.actuators.map((a) => ({ id: a.id, unit: a.unit, value: valueAt(a.curve, position) }));
  return { position, joints, plates, links, actuators };
}

/**
 * Share of the way from sample `index` to the next (stations): the moving actuator's share of its change, else `t`.
 * @param {MotionModel} model
 * @param {number} index
 * @param {number} t
 * @param {number} x
 */
function stationShare(model, index, t, x) {
  const curve = model.fraction;
  if (!curve) return t;
  const from = valueAt(curve, model.positions[index] ?? x);
  const to = valueAt(curve, model.positions[index + 1] ?? x);
  const span = to - from;
  if (!(Math.abs(span) > 1e-9)) return t;
  return Math.min(1, Math.max(0, (valueAt(curve, x) - from) / span));
}

/**
 * @typedef {object} PlanLike  the parts of `GET /v1/plans/{id}` the model reads
 * @property {{ position_m: number, achieved_orifice: import('./geometry.js').Region,
 *   plates: { plate: string, pivots_mm: [Point, Point] }[] }[]} stations
 * @property {{ edge_offset_mm: number } | null} chain
 * @property {{ bodies: { id: string, kind: string, layer: number }[],
 *   joints: { id: string, bodies: [string, string], station_positions: Point[] }[],
 *   actuators: { id: string, joint: string, kind: string, station_values: number[] }[] } | null} mechanism
 */

/**
 * @typedef {object} MotionJson  `GET /v1/plans/{id}/motion.json`
 * @property {number[]} position_m
 * @property {number[]} time_s
 * @property {{ id: string, kind: string, unit: string, values: number[] }[]} actuators
 * @property {{ id: string, positions_mm: Point[] }[]} joints
 * @property {{ id: string, pivots: [string, string], outline_local_mm: Point[] }[]} plates
 * @property {{ id: string, pins: [string, string] }[]} links
 * @property {number[]} area_mm2
 * @property {number[]} draw_down_ratio
 * @property {number[]} puller_speed_m_per_min
 * @property {number[]} die_pressure_ratio
 * @property {Record<string, { min?: number, max?: number }>} [limits]
 */

/** Process figures of motion.json the page plots, by key. */
export const SERIES_KEYS = /** @type {const} */ ([
  'area_mm2',
  'draw_down_ratio',
  'puller_speed_m_per_min',
  'die_pressure_ratio',
]);

/**
 * The model from the plan's motion download; layers, ground joints and actuated joints from the plan's mechanism.
 * @param {MotionJson} motion
 * @param {PlanLike} plan
 * @returns {MotionModel}
 */
export function modelFromMotion(motion, plan) {
  const positions = [...motion.position_m];
  const bodies = new Map((plan.mechanism?.bodies ?? []).map((b) => [b.id, b]));
  /** @type {Map<string, readonly string[]>} */
  const jointBodies = new Map((plan.mechanism?.joints ?? []).map((j) => [j.id, j.bodies]));
  const actuatedJoint = new Map((plan.mechanism?.actuators ?? []).map((a) => [a.id, a.joint]));
  /** @type {Record<string, Curve & { atStations: boolean }>} */
  const series = {};
  for (const key of SERIES_KEYS) {
    const values = motion[key];
    if (Array.isArray(values) && values.length === positions.length)
      series[key] = { positions, values, atStations: false };
  }
  return {
    source: 'motion',
    positions,
    clock: motion.time_s?.length === positions.length ? { positions, values: [...motion.time_s] } : null,
    stationPositions: plan.stations.map((s) => s.position_m),
    joints: motion.joints.map((j) => ({
      id: j.id,
      ground: (jointBodies.get(j.id) ?? []).includes('die_body'),
      positions: j.positions_mm,
    })),
    plates: motion.plates.map((p) => ({
      id: p.id,
      pivots: p.pivots,
      outline: p.outline_local_mm,
      layer: bodies.get(p.id)?.layer ?? 1,
      approximate: false,
    })),
    links: motion.links.map((l) => ({ id: l.id, pins: l.pins, layer: bodies.get(l.id)?.layer ?? 9 })),
    actuators: motion.actuators.map((a) => ({
      id: a.id,
      kind: a.kind,
      unit: a.unit,
      joint: actuatedJoint.get(a.id) ?? null,
      curve: { positions, values: a.values },
    })),
    series,
    fraction: null,
    limits: motion.limits ?? {},
  };
}

/**
 * @typedef {object} SetpointsJson  `GET /v1/plans/{id}/setpoints.json`
 * @property {string[]} columns  `position_m`, `time_s`, then `actuator_<n>_deg` or `_mm`
 * @property {number[][]} rows
 */

/**
 * The model from the plan's stations when it has no motion download: joints at each station (the mechanism's, or the
 * chain's pivots when no mechanism was built), plates drawn as bars round their pivot lines (`chain.edge_offset_mm`
 * each side), the actuators' setpoints when the plan has them. A periodic motion (setpoints past the last station)
 * returns to the first station's pose one repeat on.
 * @param {PlanLike} plan
 * @param {SetpointsJson | null} setpoints
 * @returns {MotionModel}
 */
export function modelFromStations(plan, setpoints) {
  const stationPositions = plan.stations.map((s) => s.position_m);
  const rows = setpoints?.rows ?? [];
  const column = (/** @type {string} */ name) => setpoints?.columns.indexOf(name) ?? -1;
  const xCol = column('position_m');
  const tCol = column('time_s');
  const rowX = xCol >= 0 ? rows.map((r) => r[xCol] ?? Number.NaN) : [];
  const lastStation = stationPositions[stationPositions.length - 1] ?? 0;
  const lastRow = rowX[rowX.length - 1];
  const wraps = lastRow !== undefined && lastRow > lastStation + 1e-9;
  const positions = wraps ? [...stationPositions, /** @type {number} */ (lastRow)] : [...stationPositions];
  const closeLoop = (/** @type {Point[]} */ list) => (wraps && list[0] ? [...list, list[0]] : list);

  const bodies = new Map((plan.mechanism?.bodies ?? []).map((b) => [b.id, b]));
  /** @type {MotionModel['joints']} */
  let joints;
  /** @type {MotionModel['plates']} */
  let plates;
  /** @type {MotionModel['links']} */
  let links = [];
  const e = plan.chain?.edge_offset_mm ?? 0;
  const plateIds = (plan.stations[0]?.plates ?? []).map((p) => p.plate);
  if (plan.mechanism) {
    const mech = plan.mechanism;
    joints = mech.joints.map((j) => ({
      id: j.id,
      ground: j.bodies.includes('die_body'),
      positions: closeLoop(j.station_positions),
    }));
    plates = [];
    for (const id of plateIds) {
      const ends = mech.joints.filter((j) => j.bodies.includes(id));
      const pivots = pivotJointsOf(plan, id, ends);
      if (!pivots) continue;
      const a = ends.find((j) => j.id === pivots[0])?.station_positions[0];
      const b = ends.find((j) => j.id === pivots[1])?.station_positions[0];
      if (!a || !b) continue;
      plates.push({
        id,
        pivots,
        outline: barOutline(Math.hypot(b[0] - a[0], b[1] - a[1]), e),
        layer: bodies.get(id)?.layer ?? 1,
        approximate: true,
      });
    }
    links = mech.bodies
      .filter((b) => b.kind === 'link')
      .flatMap((b) => {
        const pins = mech.joints.filter((j) => j.bodies.includes(b.id)).map((j) => j.id);
        return pins.length === 2
          ? [{ id: b.id, pins: /** @type {[string, string]} */ ([pins[0], pins[1]]), layer: b.layer }]
          : [];
      });
  } else {
    joints = [];
    plates = [];
    plateIds.forEach((id, k) => {
      const a = `${id}.pivot_a`;
      const b = `${id}.pivot_b`;
      const at = (/** @type {0 | 1} */ end) =>
        plan.stations.map(
          (s) =>
            s.plates.find((p) => p.plate === id)?.pivots_mm[end] ?? /** @type {Point} */ ([Number.NaN, Number.NaN]),
        );
      joints.push(
        { id: a, ground: false, positions: closeLoop(at(0)) },
        { id: b, ground: false, positions: closeLoop(at(1)) },
      );
      const p0 = plan.stations[0]?.plates[k]?.pivots_mm;
      const length = p0 ? Math.hypot(p0[1][0] - p0[0][0], p0[1][1] - p0[0][1]) : 0;
      plates.push({ id, pivots: [a, b], outline: barOutline(length, e), layer: 1 + (k % 2), approximate: true });
    });
  }

  const mechActuators = plan.mechanism?.actuators ?? [];
  const actuators = [];
  for (const [n, act] of mechActuators.entries()) {
    const name = setpoints?.columns.find((c) => c === `actuator_${n + 1}_deg` || c === `actuator_${n + 1}_mm`);
    const unit = act.kind === 'linear' ? 'mm' : 'deg';
    const col = name ? column(name) : -1;
    const curve =
      col >= 0
        ? { positions: rowX, values: rows.map((r) => r[col] ?? Number.NaN) }
        : { positions: stationPositions, values: act.station_values };
    actuators.push({ id: act.id, kind: act.kind, unit, joint: act.joint, curve });
  }
  const moving = actuators.find((a) => {
    const v = a.curve.values;
    return v.some((x) => Math.abs(x - (v[0] ?? x)) > 1e-9);
  });
  return {
    source: 'stations',
    positions,
    clock: tCol >= 0 && rowX.length > 1 ? { positions: rowX, values: rows.map((r) => r[tCol] ?? Number.NaN) } : null,
    stationPositions,
    joints,
    plates,
    links,
    actuators,
    series: {
      area_mm2: {
        positions: stationPositions,
        values: plan.stations.map((s) => regionArea(s.achieved_orifice)),
        atStations: true,
      },
    },
    fraction: moving && moving.curve.positions.length > stationPositions.length ? moving.curve : null,
    limits: {},
  };
}

/**
 * The two joints a plate turns about (its chain pivots, not its link pins): of the joints on the plate, those nearest
 * to the plate's pivots at the first station.
 * @param {PlanLike} plan
 * @param {string} plateId
 * @param {{ id: string, station_positions: Point[] }[]} joints  joints on this plate
 * @returns {[string, string] | null}
 */
function pivotJointsOf(plan, plateId, joints) {
  const pivots = plan.stations[0]?.plates.find((p) => p.plate === plateId)?.pivots_mm;
  if (!pivots) return null;
  const nearest = (/** @type {Point} */ q) => {
    let best = null;
    let bestD = Number.POSITIVE_INFINITY;
    for (const j of joints) {
      const p = j.station_positions[0];
      if (!p) continue;
      const d = Math.hypot(p[0] - q[0], p[1] - q[1]);
      if (d < bestD) {
        bestD = d;
        best = j.id;
      }
    }
    return best;
  };
  const a = nearest(pivots[0]);
  const b = nearest(pivots[1]);
  return a && b && a !== b ? [a, b] : null;
}

/**
 * The station whose pose the mechanism is nearest to at `x`: the nearest station by line position, where one repeat
 * on from the first station counts as the first station again.
 * @param {MotionModel} model
 * @param {number} x
 */
export function nearestStation(model, x) {
  let best = 0;
  let bestD = Number.POSITIVE_INFINITY;
  model.stationPositions.forEach((p, i) => {
    const d = Math.abs(p - x);
    if (d < bestD) {
      bestD = d;
      best = i;
    }
  });
  const last = model.positions[model.positions.length - 1];
  const lastStation = model.stationPositions[model.stationPositions.length - 1] ?? 0;
  if (last !== undefined && last > lastStation && Math.abs(last - x) < bestD) best = 0;
  return best;
}
