import type { Point } from '../geometry/index.js';
import type { MechanismSpec } from './mechanism.js';

/** One thing wrong with a mechanism description, naming the body, joint or driver at fault. */
export interface MechanismProblem {
  readonly code:
    | 'no-die-body'
    | 'several-die-bodies'
    | 'duplicate-body'
    | 'duplicate-joint'
    | 'duplicate-driver'
    | 'unknown-body'
    | 'self-joint'
    | 'zero-axis'
    | 'not-finite'
    | 'unknown-joint'
    | 'joint-driven-twice'
    | 'not-connected';
  /** Id of the body, joint or driver concerned. */
  readonly id: string;
  /** A sentence saying what is wrong and how to fix it. */
  readonly message: string;
}

/**
 * Checks a mechanism description and returns every problem found (empty when it is sound): exactly one die body,
 * unique ids, joints referring to known and distinct bodies, finite numbers, nonzero slide axes, drivers on known
 * joints (at most one per joint), and every body connected to the die body through joints. Pure; never throws.
 */
export function validateMechanism(spec: MechanismSpec): MechanismProblem[] {
  const problems: MechanismProblem[] = [];
  const bodyIds = new Set<string>();
  const dieBodies: string[] = [];
  for (const body of spec.bodies) {
    if (bodyIds.has(body.id)) {
      problems.push({ code: 'duplicate-body', id: body.id, message: `body '${body.id}' is defined more than once` });
    }
    bodyIds.add(body.id);
    if (body.kind === 'die_body') dieBodies.push(body.id);
    const init = body.initial;
    if (init && !(Number.isFinite(init.x) && Number.isFinite(init.y) && Number.isFinite(init.phi))) {
      problems.push({ code: 'not-finite', id: body.id, message: `body '${body.id}' has a non-finite initial pose` });
    }
    for (const [name, p] of Object.entries(body.points ?? {})) {
      if (!finitePoint(p)) {
        problems.push({
          code: 'not-finite',
          id: body.id,
          message: `point '${name}' of body '${body.id}' is not finite`,
        });
      }
    }
  }
  if (dieBodies.length === 0) {
    problems.push({ code: 'no-die-body', id: '', message: "the mechanism has no body of kind 'die_body' (ground)" });
  } else if (dieBodies.length > 1) {
    problems.push({
      code: 'several-die-bodies',
      id: dieBodies.join(','),
      message: `the mechanism has ${dieBodies.length} die bodies (${dieBodies.join(', ')}); exactly one is ground`,
    });
  }

  const jointIds = new Set<string>();
  const adjacency = new Map<string, string[]>();
  for (const joint of spec.joints) {
    if (jointIds.has(joint.id)) {
      problems.push({
        code: 'duplicate-joint',
        id: joint.id,
        message: `joint '${joint.id}' is defined more than once`,
      });
    }
    jointIds.add(joint.id);
    let known = true;
    for (const bodyId of [joint.bodyI, joint.bodyJ]) {
      if (!bodyIds.has(bodyId)) {
        known = false;
        problems.push({
          code: 'unknown-body',
          id: joint.id,
          message: `joint '${joint.id}' refers to body '${bodyId}', which is not defined`,
        });
      }
    }
    if (joint.bodyI === joint.bodyJ) {
      known = false;
      problems.push({
        code: 'self-joint',
        id: joint.id,
        message: `joint '${joint.id}' joins body '${joint.bodyI}' to itself`,
      });
    }
    const points: Point[] = [joint.pointI, joint.pointJ];
    if (joint.kind === 'prismatic') points.push(joint.axisI, joint.axisJ);
    if (!points.every(finitePoint)) {
      problems.push({
        code: 'not-finite',
        id: joint.id,
        message: `joint '${joint.id}' has a non-finite point or axis`,
      });
    } else if (joint.kind === 'prismatic') {
      for (const [side, axis] of [
        ['I', joint.axisI],
        ['J', joint.axisJ],
      ] as const) {
        if (Math.hypot(axis[0], axis[1]) <= 1e-12) {
          problems.push({
            code: 'zero-axis',
            id: joint.id,
            message: `prismatic joint '${joint.id}' has a zero-length axis in body ${side}; give a direction vector`,
          });
        }
      }
    }
    if (known) {
      link(adjacency, joint.bodyI, joint.bodyJ);
      link(adjacency, joint.bodyJ, joint.bodyI);
    }
  }

  const driverIds = new Set<string>();
  const drivenJoints = new Set<string>();
  for (const driver of spec.drivers ?? []) {
    if (driverIds.has(driver.id)) {
      problems.push({
        code: 'duplicate-driver',
        id: driver.id,
        message: `driver '${driver.id}' is defined more than once`,
      });
    }
    driverIds.add(driver.id);
    if (!jointIds.has(driver.joint)) {
      problems.push({
        code: 'unknown-joint',
        id: driver.id,
        message: `driver '${driver.id}' drives joint '${driver.joint}', which is not defined`,
      });
    } else if (drivenJoints.has(driver.joint)) {
      problems.push({
        code: 'joint-driven-twice',
        id: driver.id,
        message: `joint '${driver.joint}' is driven by more than one driver ('${driver.id}' is the second)`,
      });
    }
    drivenJoints.add(driver.joint);
    if (driver.offset !== undefined && !Number.isFinite(driver.offset)) {
      problems.push({ code: 'not-finite', id: driver.id, message: `driver '${driver.id}' has a non-finite offset` });
    }
  }

  const ground = dieBodies[0];
  if (ground !== undefined) {
    const reached = new Set<string>([ground]);
    const stack = [ground];
    while (stack.length > 0) {
      const b = stack.pop()!;
      for (const nb of adjacency.get(b) ?? []) {
        if (!reached.has(nb)) {
          reached.add(nb);
          stack.push(nb);
        }
      }
    }
    for (const id of bodyIds) {
      if (!reached.has(id)) {
        problems.push({
          code: 'not-connected',
          id,
          message: `body '${id}' is not connected to the die body through any chain of joints`,
        });
      }
    }
  }
  return problems;
}

function finitePoint(p: Point): boolean {
  return Number.isFinite(p[0]) && Number.isFinite(p[1]);
}

function link(adjacency: Map<string, string[]>, a: string, b: string): void {
  const list = adjacency.get(a);
  if (list) list.push(b);
  else adjacency.set(a, [b]);
}
