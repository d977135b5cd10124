import type { Body, Driver, Joint, Mechanism, MechanismSpec } from './mechanism.js';
import { validateMechanism } from './validate-mechanism.js';

/**
 * Fills the documented defaults of a mechanism description, validates it with `validateMechanism` and returns a
 * deeply frozen `Mechanism`. Throws one `Error` listing every problem (each naming its body, joint or driver) when the
 * description is unsound: that is programmer misuse, not a design finding.
 */
export function defineMechanism(spec: MechanismSpec): Mechanism {
  const problems = validateMechanism(spec);
  if (problems.length > 0) {
    throw new Error(`invalid mechanism: ${problems.map((p) => p.message).join('; ')}`);
  }
  const bodies: Body[] = spec.bodies.map((b) =>
    Object.freeze({
      id: b.id,
      kind: b.kind,
      layer: b.layer ?? 0,
      points: Object.freeze(Object.fromEntries(Object.entries(b.points ?? {}).map(([k, p]) => [k, freezePoint(p)]))),
      initial: Object.freeze(
        b.kind === 'die_body'
          ? { x: 0, y: 0, phi: 0 }
          : { x: b.initial?.x ?? 0, y: b.initial?.y ?? 0, phi: b.initial?.phi ?? 0 },
      ),
    }),
  );
  const joints: Joint[] = spec.joints.map((j) =>
    j.kind === 'revolute'
      ? Object.freeze({
          kind: 'revolute' as const,
          id: j.id,
          bodyI: j.bodyI,
          pointI: freezePoint(j.pointI),
          bodyJ: j.bodyJ,
          pointJ: freezePoint(j.pointJ),
        })
      : Object.freeze({
          kind: 'prismatic' as const,
          id: j.id,
          bodyI: j.bodyI,
          pointI: freezePoint(j.pointI),
          axisI: freezePoint(j.axisI),
          bodyJ: j.bodyJ,
          pointJ: freezePoint(j.pointJ),
          axisJ: freezePoint(j.axisJ),
        }),
  );
  const drivers: Driver[] = (spec.drivers ?? []).map((d) =>
    Object.freeze({ id: d.id, joint: d.joint, offset: d.offset ?? 0 }),
  );
  return Object.freeze({
    bodies: Object.freeze(bodies),
    joints: Object.freeze(joints),
    drivers: Object.freeze(drivers),
  });
}

function freezePoint(p: readonly [number, number]): readonly [number, number] {
  return Object.freeze([p[0], p[1]] as const);
}
