import type { Point } from '../geometry/index.js';
import { createPositionSolver } from '../kinematics/index.js';
import { buildMechanism, posesAt } from './build-mechanism.js';
import type { MotionDefect } from './drive-through-stations.js';
import { type ActuatorPlace, type EvaluatedDesign, evaluateDesign } from './evaluate-design.js';
import { type LinkCandidate, linkCandidates, type PlateCandidates } from './link-candidates.js';
import type { LinkDesign } from './link-design.js';
import type { MechaniseContext } from './mechanise-context.js';

/** What the search for links learnt about one plate. */
export interface PlateSearch {
  readonly body: string;
  /** Dyads synthesised for it. */
  readonly tried: number;
  /** Candidates that passed screening. */
  readonly screened: number;
  /** Why candidates were turned down (screening and partial motion): count by code (see `LinkRejection`). */
  readonly rejections: Readonly<Record<string, number>>;
  /** Of the dyads tried, links from the die body, and why those were turned down in screening. */
  readonly triedFromGround: number;
  readonly groundRejections: Readonly<Record<string, number>>;
  /** Where the plate turns between stations (mean displacement pole relative to the die body), mm; null if it translates. */
  readonly pole: Point | null;
  /** Screened links driven in a partial mechanism. */
  readonly driven: number;
  /** True when some link on this plate drove its partial mechanism through every station. */
  readonly accepted: boolean;
}

/** Outcome of the reduced mode for one actuator count. */
export interface ReducedModeOutcome {
  readonly design: EvaluatedDesign | null;
  /** Complete mechanisms driven through the stations. */
  readonly assemblies: number;
  /** Partial mechanisms driven through the stations. */
  readonly partialTraces: number;
  readonly plates: readonly PlateSearch[];
  /** Defects of complete mechanisms that failed, first seen first (at most a few). */
  readonly assemblyDefects: readonly MotionDefect[];
  /** True when a budget ran out before the search was complete. */
  readonly budgetExhausted: boolean;
}

/**
 * Reduced mode: degrees of freedom − actuators binary links, then actuators on die-body pivots. The chain's moving
 * bodies B₁ … B_M cannot take a link at B₁ and B_M (held by the die body already); of B₂ … B_{M−1}, a block of
 * `min(a, 2)` consecutive bodies stays free and every other body gets one link, so that the mechanism solves as a
 * sequence of dyads (Assur groups of class II) from both ends toward the free block:
 * - the start part B₁ … B_{f−1} is driven from the chain's start ground joint J₀, each body fixed by its link (from
 *   the die body or from a plate already fixed) and its joint with the body before it;
 * - the end part B_{f+b} … B_M likewise from the end ground joint J_M;
 * - the free block closes the loop (a = 1: one plate between two known pins; a = 2: two plates, the second actuator
 *   on J_M); for a ≥ 3 the start part also holds a − 2 free plates each followed by a plate on a driven crank.
 * Each link is accepted only when the partial mechanism it completes drives through every leg without branch, order
 * or circuit defect and within the transmission-angle band (exact: a part's motion depends on its own driver only);
 * then the complete mechanism is driven with each admissible actuator placement on the die body (start or end ground
 * joint, or a link's ground pivot), screened by the condition of the driven Jacobian at the stations, and the
 * placement that passes with the best conditioning and transmission (`placementScore`) is chosen. Free-block
 * places are tried from the chain's end toward its start; link choices backtrack within the budgets.
 */
export function reducedMode(
  context: MechaniseContext,
  actuatorCount: number,
  cache: Map<string, PlateCandidates>,
): ReducedModeOutcome {
  const { topology, options } = context;
  const bodies = topology.bodies;
  const M = bodies.length;
  const block = Math.min(actuatorCount, 2);
  const cranks = actuatorCount - block;
  const tallies = new Map<string, Map<string, number>>();
  const accepted = new Set<string>();
  const driven = new Map<string, number>();
  const budget = { partial: 0, assemblies: 0, exhausted: false };
  const assemblyDefects: MotionDefect[] = [];
  const candidatesOf = (body: string): PlateCandidates => {
    let c = cache.get(body);
    if (!c) {
      c = linkCandidates(context, body);
      cache.set(body, c);
    }
    if (!tallies.has(body)) tallies.set(body, new Map(c.rejections));
    return c;
  };
  // every plate's candidates, also those the search never reaches, so a failure can be explained plate by plate
  for (const b of bodies.slice(1, M - 1)) candidatesOf(b.id);
  const tally = (body: string, code: string) => {
    const t = tallies.get(body)!;
    t.set(code, (t.get(code) ?? 0) + 1);
  };

  /** Depth-first over link choices of one part, yielding every complete assignment that drives cleanly. */
  function* solvePart(
    order: readonly number[],
    side: 'up' | 'down',
    driver: string,
    crankBodies: ReadonlySet<number>,
  ): Generator<{ links: LinkDesign[]; cranks: LinkDesign[] }> {
    const recurse = function* (
      t: number,
      links: LinkDesign[],
      cranksSoFar: LinkDesign[],
    ): Generator<{ links: LinkDesign[]; cranks: LinkDesign[] }> {
      if (t === order.length) {
        yield { links, cranks: cranksSoFar };
        return;
      }
      const k = order[t]!;
      const body = bodies[k]!.id;
      const subset = new Set(bodies.filter((_, m) => (side === 'up' ? m <= k : m >= k)).map((b) => b.id));
      const crank = crankBodies.has(k);
      const choices = rankFor(candidatesOf(body).candidates, side, crank).filter(
        (c) => c.link.bodyA === 'die_body' || (subset.has(c.link.bodyA) && !crank),
      );
      for (const c of choices) {
        if (budget.partial >= options.maxPartialTraces) {
          budget.exhausted = true;
          return;
        }
        budget.partial++;
        driven.set(body, (driven.get(body) ?? 0) + 1);
        const link: LinkDesign = { ...c.link, id: `${body}#${budget.partial}` };
        const nextLinks = [...links, link];
        const nextDriven = crank ? [...cranksSoFar, link] : cranksSoFar;
        const actuators: ActuatorPlace[] = [driver, ...nextDriven];
        const design = evaluateDesign(context, nextLinks, actuators, subset);
        if (!design.motion.ok) {
          tally(body, design.motion.defects[0]!.code);
          continue;
        }
        accepted.add(body);
        yield* recurse(t + 1, nextLinks, nextDriven);
      }
    };
    yield* recurse(0, [], []);
  }

  let best: EvaluatedDesign | null = null;
  // free-block places, nearest the chain's end first
  for (let f = M - 1 - block; f >= 1 + 2 * cranks && !best; f--) {
    const startOrder = Array.from({ length: f - 1 }, (_, i) => i + 1).filter((k) => !(k <= 2 * cranks && k % 2 === 1));
    const crankBodies = new Set(Array.from({ length: cranks }, (_, i) => 2 * i + 2));
    const endOrder = Array.from({ length: M - 1 - (f + block) }, (_, i) => M - 2 - i);
    const startJoint = topology.joints[0]!.id;
    const endJoint = topology.joints[M]!.id;
    // end-part solutions are met again for every start-part solution: generate each once
    const endParts = solvePart(endOrder, 'down', endJoint, new Set());
    const endSeen: { links: LinkDesign[]; cranks: LinkDesign[] }[] = [];
    const endAt = (i: number) => {
      while (endSeen.length <= i) {
        const next = endParts.next();
        if (next.done) return null;
        endSeen.push(next.value);
      }
      return endSeen[i]!;
    };
    for (const start of solvePart(startOrder, 'up', startJoint, crankBodies)) {
      for (let e = 0; ; e++) {
        const end = endAt(e);
        if (!end) break;
        if (budget.assemblies >= options.maxAssemblies) {
          budget.exhausted = true;
          break;
        }
        const links = [...start.links, ...end.links];
        const design = placeActuators(context, links, actuatorCount, budget, assemblyDefects);
        if (design) {
          best = design;
          break;
        }
        if (budget.exhausted) break;
      }
      if (best || budget.exhausted) break;
    }
    if (budget.exhausted) break;
  }
  const plates: PlateSearch[] = bodies.slice(1, M - 1).map((b) => {
    const c = cache.get(b.id);
    return {
      body: b.id,
      tried: c?.tried ?? 0,
      screened: c?.candidates.length ?? 0,
      rejections: Object.fromEntries(tallies.get(b.id) ?? c?.rejections ?? []),
      triedFromGround: c?.triedFromGround ?? 0,
      groundRejections: Object.fromEntries(c?.groundRejections ?? []),
      pole: c?.pole ?? null,
      driven: driven.get(b.id) ?? 0,
      accepted: accepted.has(b.id),
    };
  });
  return {
    design: best,
    assemblies: budget.assemblies,
    partialTraces: budget.partial,
    plates,
    assemblyDefects: assemblyDefects.slice(0, 5),
    budgetExhausted: budget.exhausted,
  };
}

/** Candidates in the order a part tries them: exact links (residual ≤ 1e-8 mm) first, then best transmission seen from the part's driver. */
function rankFor(candidates: readonly LinkCandidate[], side: 'up' | 'down', crank: boolean): LinkCandidate[] {
  if (crank) return candidates.filter((c) => c.link.bodyA === 'die_body');
  return candidates
    .filter((c) => c[side] !== null)
    .sort(
      (p, q) =>
        Number(p.link.residualMm > 1e-8) - Number(q.link.residualMm > 1e-8) ||
        q[side]! - p[side]! ||
        p.link.lengthMm - q.link.lengthMm,
    );
}

/**
 * The actuator placement for a complete set of links: every set of `count` die-body joints (chain ground joints and
 * link ground pivots; rotary ones first) is screened by solving the stations (converged, not singular), the five best
 * conditioned are driven through the stations, and among those that pass the one with the fewest linear actuators,
 * then the lowest `placementScore`, is returned.
 */
function placeActuators(
  context: MechaniseContext,
  links: readonly LinkDesign[],
  count: number,
  budget: { assemblies: number; exhausted: boolean },
  defects: MotionDefect[],
): EvaluatedDesign | null {
  const { topology, stations, options } = context;
  const places: { place: ActuatorPlace; linear: boolean }[] = [];
  for (const j of [topology.joints[0]!, topology.joints[topology.joints.length - 1]!]) {
    if (j.bodyI === 'die_body' || j.bodyJ === 'die_body') places.push({ place: j.id, linear: j.kind === 'prismatic' });
  }
  for (const l of links) if (l.bodyA === 'die_body') places.push({ place: l, linear: false });
  const combos: { places: ActuatorPlace[]; linear: number }[] = [];
  const pick = (from: number, chosen: typeof places) => {
    if (combos.length >= 200) return;
    if (chosen.length === count) {
      combos.push({ places: chosen.map((c) => c.place), linear: chosen.filter((c) => c.linear).length });
      return;
    }
    for (let i = from; i < places.length; i++) pick(i + 1, [...chosen, places[i]!]);
  };
  pick(0, []);
  const distinctPoses = stations.representatives.map((r) => stations.poses[r]!);
  const named = links.map((l, k) => ({ ...l, id: `link_${k + 1}` }));
  const screened: { places: ActuatorPlace[]; linear: number; condition: number }[] = [];
  for (const combo of combos) {
    const joints = combo.places.map((p) => (typeof p === 'string' ? p : `${named[links.indexOf(p)]!.id}_ground`));
    const mechanism = buildMechanism(topology, named, joints, distinctPoses[0]!);
    const solver = createPositionSolver(mechanism, options.trace);
    let condition = 0;
    for (const pose of posesAt(mechanism, topology, distinctPoses)) {
      const r = solver.solve(pose.actuators, pose);
      condition = r.status === 'converged' ? Math.max(condition, r.conditionEstimate) : Number.POSITIVE_INFINITY;
      if (!Number.isFinite(condition)) break;
    }
    if (Number.isFinite(condition)) screened.push({ ...combo, condition });
  }
  screened.sort((p, q) => p.linear - q.linear || p.condition - q.condition);
  let best: { design: EvaluatedDesign; linear: number } | null = null;
  for (const s of screened.slice(0, 5)) {
    if (budget.assemblies >= options.maxAssemblies) {
      budget.exhausted = true;
      break;
    }
    budget.assemblies++;
    const design = evaluateDesign(context, links, s.places);
    if (!design.motion.ok) {
      defects.push(...design.motion.defects);
      continue;
    }
    if (
      !best ||
      s.linear < best.linear ||
      (s.linear === best.linear && placementScore(design) < placementScore(best.design))
    ) {
      best = { design, linear: s.linear };
    }
  }
  return best?.design ?? null;
}

/**
 * How hard a placement is to drive: the largest condition estimate of the driven Jacobian along the motion (it sees
 * every dyad, plate–plate joints included, and an actuator whose small stroke moves the plates a lot) divided by the
 * sine of the worst transmission angle of the binary links (a link turned into a crank is no longer measured). Lower
 * is better.
 */
function placementScore(design: EvaluatedDesign): number {
  return design.motion.maxCondition / Math.max(design.motion.worstTransmissionSine, 1e-12);
}
