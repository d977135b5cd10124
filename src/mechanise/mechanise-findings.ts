import type { Finding } from '../domain/index.js';
import { findOrderDefect } from '../kinematics/index.js';
import type { MotionDefect, MotionPlace } from './drive-through-stations.js';
import type { EvaluatedDesign } from './evaluate-design.js';
import type { MechanisationResult, MechanismReport, StationOutcome } from './mechanisation-result.js';
import type { MechaniseContext } from './mechanise-context.js';
import type { PlateSearch } from './reduced-mode.js';
import { describeClearance } from './motion-clearance.js';

/** What each rejection code means to a process engineer, after a count of links: "12 are shorter than …". */
function reasons(options: MechaniseContext['options']): Readonly<Record<string, string>> {
  const [lo, hi] = options.transmissionLimitDeg;
  return {
    COLLINEAR: 'have pins that move on straight lines (a slot would fit them, not a link)',
    RESIDUAL: 'fit no rigid link within the residual limit',
    GROUND_OUTSIDE_FRAME: 'have their ground pivot outside the die-body frame',
    GROUND_IN_OPENING: 'have their ground pivot in the die opening (or within a pin clearance of it)',
    GROUND_IN_MELT: 'have their ground pivot in the melt channel',
    GROUND_UNDER_PLATE: 'have their ground pivot where a plate sweeps over it',
    PIN_OUTSIDE_PLATE: "need a pin outside a plate's body (behind its pivot line, clear of its holes)",
    TOO_SHORT: `are shorter than ${options.linkLengthMinMm} mm`,
    TOO_LONG: `are longer than ${options.linkLengthMaxMm} mm`,
    CROSSES_MELT: 'come too close to the melt channel at a station',
    TRANSMISSION_AT_STATIONS: `have a transmission angle outside ${lo}°–${hi}° at a station`,
    BRANCH_DEFECT: 'would pass a dead point between stations (branch defect)',
    ORDER_DEFECT: 'stop at a dead point between stations, so the stations are not kept in order (order defect)',
    CIRCUIT_DEFECT: 'reach a station in another assembly (circuit defect)',
    SINGULAR_STATION: 'put a station at a dead point',
    TRANSMISSION_ANGLE: `have a transmission angle outside ${lo}°–${hi}° during the motion`,
    COLLISION: 'collide with a plate, a pin or the melt somewhere along the motion',
  };
}

/** Findings of a mechanism that passed. */
export function successFindings(
  context: MechaniseContext,
  design: EvaluatedDesign,
  mode: 'direct' | 'reduced',
  report: MechanismReport,
  outcomes: readonly StationOutcome[],
  transmission: MechanisationResult['transmission'],
  mobility: { readonly grubler: number; readonly numerical: number },
): Finding[] {
  const { options, topology } = context;
  const a = options.actuatorCount;
  const findings: Finding[] = [];
  const actuators = report.actuators.map((x) => `${x.kind} at ${x.joint}`).join(', ');
  const angles =
    transmission.minDeg === null
      ? 'there are no binary links, so no transmission angles'
      : `transmission angles stay within ${fmt(transmission.minDeg)}°–${fmt(transmission.maxDeg!)}°`;
  findings.push({
    code: 'MECHANISM_FOUND',
    severity: 'info',
    value: a,
    message:
      `The chain (${topology.degreesOfFreedom} degrees of freedom) is driven by ${a} actuator(s) (${actuators})` +
      `${mode === 'direct' ? ' directly, without binary links' : ` with ${design.links.length} binary link(s)`}; it passes ` +
      `through all ${outcomes.length} stations in schedule order without dead points; ${angles}.` +
      (mode === 'direct' && a > 1
        ? ' Actuators on pivots between plates ride on moving plates; fewer actuators need binary links.'
        : ''),
  });
  if (mobility.grubler !== a || mobility.numerical !== a) {
    findings.push({
      code: 'MOBILITY_MISMATCH',
      severity: 'error',
      value: mobility.numerical,
      limit: a,
      message: `The mechanism's mobility is ${mobility.grubler} by count and ${mobility.numerical} by Jacobian rank, not the ${a} actuator(s) asked for: special geometry; do not build it without review.`,
    });
  }
  for (const act of report.actuators) {
    // Chase & Mirth's order test on the station values: a reversal is allowed (a back-and-forth schedule), as each
    // leg was traced without passing a dead point; the line controller needs to know it
    const order = findOrderDefect(act.stationValues, { tolerance: 1e-6 });
    if (order.reversals.length > 0) {
      findings.push({
        code: 'ACTUATOR_REVERSES',
        severity: 'info',
        station: order.reversals[0]!,
        message: `${act.id} (${act.kind} at ${act.joint}) reverses before station(s) ${order.reversals.join(', ')}: the schedule goes back and forth; every leg between stations is driven without passing a dead point.`,
      });
    }
  }
  const [goodMin, goodMax] = options.transmissionGoodDeg;
  for (const t of transmission.links) {
    const bad = t.minDeg < goodMin ? t.minDeg : t.maxDeg > goodMax ? t.maxDeg : null;
    if (bad === null) continue;
    findings.push({
      code: 'TRANSMISSION_ANGLE_MARGINAL',
      severity: 'warning',
      value: bad,
      limit: bad < goodMin ? goodMin : goodMax,
      message: `${t.linkId}'s transmission angle reaches ${fmt(bad)}° (usual rule ${goodMin}°–${goodMax}°): it still drives, but with more pin force and sensitivity to clearance there.`,
    });
  }
  const { stations } = context;
  const where = (at: MotionPlace) =>
    at.leg !== null
      ? `between stations ${stations.representatives[at.leg[0]]} and ${stations.representatives[at.leg[1]]}, ${Math.round(at.fraction * 100)} % of the way`
      : `at station ${stations.representatives[at.position ?? 0]}`;
  const stationOf = (at: MotionPlace) => stations.representatives[at.leg ? at.leg[0] : (at.position ?? 0)]!;
  const room = design.clearances.filter((c) => c.kind !== 'same-layer');
  if (room.length > 0) {
    const c = room[0]!;
    findings.push({
      code: 'CLEARANCE',
      severity: 'info',
      station: stationOf(c.at),
      value: c.clearanceMm,
      message: `Over the whole motion the tightest room is ${fmt(c.clearanceMm)} mm, between ${c.parts[0]} and ${c.parts[1]} (${describeClearance(c.kind)}), ${where(c.at)}. Die-body pins clear the plates' sweep, link pins clear the layers they pass, and links stay over plates where they cross the opening.`,
    });
  }
  for (const c of design.clearances.filter((x) => x.kind === 'same-layer' && x.clearanceMm < 0)) {
    findings.push({
      code: 'PLATES_OVERLAP_ON_LAYER',
      severity: 'warning',
      station: stationOf(c.at),
      value: -c.clearanceMm,
      message: `${c.parts[0]} and ${c.parts[1]} share a layer and overlap by up to ${fmt(-c.clearanceMm)} mm ${where(c.at)}: give one of them another layer or trim its body behind the pivot line (clear of the melt edge).`,
    });
  }
  for (const t of transmission.joints) {
    if (t.worstDeg >= goodMin && t.worstDeg <= goodMax) continue;
    const at = t.worstAt;
    const limit = t.worstDeg < goodMin ? goodMin : goodMax;
    findings.push({
      code: 'TRANSMISSION_ANGLE_AT_JOINT',
      severity: 'warning',
      station: stationOf(at),
      value: t.worstDeg,
      limit,
      message: `At ${t.jointId} two plates drive each other at a transmission angle of ${fmt(t.worstDeg)}° ${where(at)} (usual rule ${goodMin}°–${goodMax}°; over the motion ${fmt(t.minDeg)}°–${fmt(t.maxDeg)}°). Near 0° or 180° the plates are close to a stretched or folded dead point: melt pressure there loads the pins and actuator heavily and the plates' position becomes sensitive to pin clearance. A link to one of the two plates, or a different actuator place, would help.`,
    });
  }
  for (const link of design.links) {
    if (link.residualMm > 1e-6) {
      findings.push({
        code: 'LINK_NOT_EXACT',
        severity: 'info',
        value: link.residualMm,
        message: `${link.id} is a least-squares link: its pin distance varies by ${fmt(link.residualMm, 4)} mm over the stations, taken up by the chain's fit tolerance.`,
      });
    }
    const body = topology.bodies.find((b) => b.id === link.bodyB)!;
    const [x0, x1] = body.pinSpanMm;
    const end = Math.min(link.pinB[0] - x0, x1 - link.pinB[0]);
    if (end < context.clearanceMm) {
      // the hole would break out of the plate as drawn (closer than its radius) or leave too thin a ligament: the
      // plate carries a boss of e round the pin there, which the clearance checks include
      const breaksOut = end < context.shape.holeRadiusMm;
      findings.push({
        code: 'LINK_PIN_NEAR_PLATE_END',
        severity: breaksOut ? 'warning' : 'info',
        value: end,
        limit: context.clearanceMm,
        message: `${link.id}'s pin on ${link.bodyB} is ${fmt(end)} mm from the plate's side edge, less than a hole and ligament (${fmt(context.clearanceMm)} mm)${breaksOut ? ': its hole would break out of the plate as drawn' : ''}. The plate must be widened there by a boss of ${fmt(context.clearanceMm)} mm round the pin (behind the pivot line, clear of the melt); the clearance checks include that boss.`,
      });
    }
  }
  const closure = Math.max(...outcomes.map((o) => o.closureAdjustmentMm));
  if (closure > 1e-6) {
    findings.push({
      code: 'CHAIN_CLOSURE_ADJUSTED',
      severity: 'info',
      value: closure,
      message: `The fitted chain closed onto its end pin within ${fmt(closure, 5)} mm; each station was closed exactly (smallest pivot moves) before the links were synthesised.`,
    });
  }
  for (const o of outcomes) {
    if (o.deviationMm > options.fitToleranceMm) {
      findings.push({
        code: 'ACHIEVED_ORIFICE_DEVIATION',
        severity: 'warning',
        station: o.station,
        value: o.deviationMm,
        limit: options.fitToleranceMm,
        ...(o.worstAt ? { at: o.worstAt } : {}),
        message: `Where the mechanism puts the plates, station ${o.station}'s orifice deviates from its target by ${fmt(o.deviationMm, 3)} mm, more than the fit tolerance ${options.fitToleranceMm} mm.`,
      });
    }
  }
  findings.push({ code: 'LAYER_MODEL', severity: 'info', message: LAYER_MODEL });
  return findings;
}

/** The stacking of plates and links, in words. */
export const LAYER_MODEL =
  'Plates alternate between layers 1 and 2, and a plate that would overlap another of its layer at a station takes ' +
  'the next free layer (the sliding half of a telescoping pair takes the other of 1 and 2); slider blocks of slotted ' +
  'ends take the layer above the plates, and every binary link a layer of its own above those, so links cannot ' +
  'collide with each other by construction. Pins and links are checked for room against every other part along the ' +
  'whole motion (CLEARANCE).';

/** Findings of a mechanisation that found nothing: why, per plate, and what would help. */
export function failureFindings(
  context: MechaniseContext,
  plates: readonly PlateSearch[],
  defects: readonly MotionDefect[],
  smallest: number | null,
  search: MechanisationResult['search'],
  reason: 'closure' | 'rigid' | 'too-many' | 'search',
): Finding[] {
  const { options, topology } = context;
  const a = options.actuatorCount;
  const d = topology.degreesOfFreedom;
  const plateCount = topology.bodies.filter((b) => b.role === 'plate').length;
  if (reason === 'closure') {
    return [
      {
        code: 'CHAIN_DOES_NOT_CLOSE',
        severity: 'error',
        message: `The fitted chain of ${plateCount} plates cannot be closed onto its end pin at every station, so no mechanism can be built from it: refit the chain (a different plate count or a looser fit tolerance).`,
      },
    ];
  }
  if (reason === 'rigid') {
    return [
      {
        code: 'CHAIN_CANNOT_MOVE',
        severity: 'error',
        value: d,
        message: `The fitted chain of ${plateCount} plates has ${d} degrees of freedom: it is a rigid structure and no actuator can move it. Use more plates, a slotted end or a telescoping plate.`,
      },
    ];
  }
  if (reason === 'too-many') {
    return [
      {
        code: 'TOO_MANY_ACTUATORS',
        severity: 'error',
        value: a,
        limit: d,
        message: `${a} actuators were asked for, but the chain of ${plateCount} plates has only ${d} degree(s) of freedom: more actuators than that would fight each other. Ask for ${d} (one per degree of freedom, no links) or fewer (binary links take up the rest)${smallest !== null ? `; ${smallest} is the fewest that works` : ''}.`,
      },
    ];
  }
  const findings: Finding[] = [];
  const help: string[] = [];
  if (a < d) help.push(`another actuator (${smallest !== null ? `${smallest} work` : `up to ${d}`})`);
  help.push('a different plate count (refit with limits.max_plates)');
  help.push(
    `relaxing a limit (link length ${options.linkLengthMinMm}–${options.linkLengthMaxMm} mm, transmission angle ${options.transmissionLimitDeg[0]}°–${options.transmissionLimitDeg[1]}°, ground-pivot frame ${options.frameMarginMm} mm)`,
  );
  const linkless = plates.filter((p) => p.screened === 0).map((p) => p.body);
  const cause =
    linkless.length > 0
      ? ` Links pass screening on only ${plates.length - linkless.length} of the ${plates.length} plates that could take one (none on ${linkless.join(', ')}; see the findings per plate), and ${a} actuator(s) need ${d - a} link(s).`
      : '';
  findings.push({
    code: 'NO_MECHANISM',
    severity: 'error',
    value: a,
    message: `No mechanism with ${a} actuator(s) drives the chain of ${plateCount} plates (${d} degrees of freedom) through every station in order.${cause} What would help: ${help.join('; ')}.`,
  });
  for (const p of plates) {
    if (p.accepted) continue;
    findings.push({
      code: 'PLATE_HAS_NO_LINK',
      severity: 'warning',
      value: p.tried,
      ...(p.pole ? { at: p.pole } : {}),
      message: plateMessage(context, p),
    });
  }
  const first = defects[0];
  if (first && plates.some((p) => p.accepted)) {
    findings.push({
      code: 'MECHANISM_DEFECT',
      severity: 'warning',
      ...(first.value !== undefined ? { value: first.value } : {}),
      message: `Links were found plate by plate, but the complete mechanism fails: ${first.message}.`,
    });
  }
  if (search.budgetExhausted) {
    findings.push({
      code: 'SEARCH_BUDGET_EXHAUSTED',
      severity: 'warning',
      value: search.assemblies + search.partialTraces,
      message: `The search stopped at its budget (${search.partialTraces} partial and ${search.assemblies} complete mechanisms driven) before it had tried every combination of links: a mechanism may exist that it did not reach. Another actuator, other link length limits (links.min_length_mm, links.max_length_mm) or another plate count (limits.plate_count) changes what it tries.`,
    });
  }
  if (smallest !== null) {
    findings.push({
      code: 'SMALLEST_ACTUATOR_COUNT',
      severity: 'info',
      value: smallest,
      message: `${smallest} actuators drive the chain through every station${smallest === d ? ' (direct mode: one per degree of freedom, no links)' : ''}.`,
    });
  }
  return findings;
}

/** Why no link fits one plate, from the search's tallies, in a process engineer's words. */
function plateMessage(context: MechaniseContext, p: PlateSearch): string {
  const why = reasons(context.options);
  if (p.tried === 0) {
    const room = context.pinRegions.get(p.body)?.grid(context.options.circlePointSteps).length ?? 0;
    if (room === 0) {
      return `${p.body} can take no binary link: its body has no room for a link pin behind the pivot line (plate too short or too shallow).`;
    }
    const all = summarise(p.rejections, why);
    return `${p.body} can take no binary link: no link could be synthesised for its positions${all ? `; of the solutions, ${all}` : ''}.`;
  }
  const parts: string[] = [];
  if (p.screened === 0) parts.push(`${p.body} can take no binary link: none of the ${p.tried} tried passes screening.`);
  else if (p.driven === 0) {
    parts.push(
      `${p.body}: ${p.screened} of the ${p.tried} links tried pass screening, but none could be used: the search fails at plates nearer the chain's ends first, or their transmission is good only when driven from the other end.`,
    );
  } else {
    parts.push(
      `${p.body}: ${p.screened} of the ${p.tried} links tried pass screening, but none of the ${p.driven} driven keeps the stations in order.`,
    );
  }
  if (p.pole) {
    const where = context.groundRegion.check(p.pole);
    const place =
      where === 'GROUND_IN_OPENING'
        ? 'in the die opening or within a pin clearance of it'
        : where === 'GROUND_IN_MELT'
          ? 'in the melt channel'
          : where === 'GROUND_OUTSIDE_FRAME'
            ? 'outside the die-body frame'
            : 'in the die body';
    parts.push(
      ` Between stations the plate turns about points near (${fmt(p.pole[0])}, ${fmt(p.pole[1])}) mm (${place}), and the ground pivot of a rigid link lies near there unless its plate pin is far off.`,
    );
  }
  const ground = summarise(p.groundRejections, why);
  if (ground) parts.push(` Of the ${p.triedFromGround} links from the die body, ${ground}.`);
  const all = summarise(p.rejections, why);
  if (all) parts.push(` Of all links turned down (from the die body and from other plates), ${all}.`);
  return parts.join('');
}

function summarise(tally: Readonly<Record<string, number>>, why: Readonly<Record<string, string>>): string {
  return Object.entries(tally)
    .sort((x, y) => y[1] - x[1])
    .slice(0, 3)
    .map(([code, count]) => `${count} ${why[code] ?? code.toLowerCase()}`)
    .join('; ');
}

function fmt(x: number, digits = 1): string {
  const f = 10 ** digits;
  return String(Math.round(x * f) / f);
}
