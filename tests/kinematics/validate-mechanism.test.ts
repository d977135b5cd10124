import { describe, expect, it } from 'vitest';
import { defineMechanism, type MechanismSpec, validateMechanism } from '../../src/kinematics/index.js';

const base: MechanismSpec = {
  bodies: [
    { id: 'die_body', kind: 'die_body' },
    { id: 'crank', kind: 'link' },
  ],
  joints: [{ kind: 'revolute', id: 'O2', bodyI: 'die_body', pointI: [0, 0], bodyJ: 'crank', pointJ: [0, 0] }],
  drivers: [{ id: 'motor', joint: 'O2' }],
};

describe('validateMechanism', () => {
  it('validateMechanism(sound mechanism) returns no problems and defineMechanism fills the defaults', () => {
    // Reference: the documented defaults (layer 0, no points, zero initial pose, offset 0)
    expect(validateMechanism(base)).toEqual([]);
    const m = defineMechanism(base);
    expect(m.bodies[1]).toEqual({ id: 'crank', kind: 'link', layer: 0, points: {}, initial: { x: 0, y: 0, phi: 0 } });
    expect(m.drivers[0]?.offset).toBe(0);
    expect(Object.isFrozen(m.bodies)).toBe(true);
  });

  it('validateMechanism(joint to an unknown body) names the joint and the body', () => {
    // Reference: the brief's misuse cases (dangling joint)
    const spec: MechanismSpec = {
      ...base,
      joints: [
        ...base.joints,
        { kind: 'revolute', id: 'A', bodyI: 'crank', pointI: [40, 0], bodyJ: 'ghost', pointJ: [0, 0] },
      ],
    };
    const problems = validateMechanism(spec);
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatchObject({ code: 'unknown-body', id: 'A' });
    expect(() => defineMechanism(spec)).toThrow(/joint 'A' refers to body 'ghost'/);
  });

  it('validateMechanism(body with no joint path to the die body) reports it not connected', () => {
    // Reference: the brief's misuse cases (body not connected to ground)
    const spec: MechanismSpec = {
      ...base,
      bodies: [...base.bodies, { id: 'p1', kind: 'plate' }, { id: 'p2', kind: 'plate' }],
      joints: [...base.joints, { kind: 'revolute', id: 'X', bodyI: 'p1', pointI: [0, 0], bodyJ: 'p2', pointJ: [0, 0] }],
    };
    const problems = validateMechanism(spec);
    expect(problems.map((p) => [p.code, p.id])).toEqual([
      ['not-connected', 'p1'],
      ['not-connected', 'p2'],
    ]);
    expect(() => defineMechanism(spec)).toThrow(/body 'p1' is not connected/);
  });

  it('validateMechanism(duplicate joint id, zero-length slide axis, no die body) reports each', () => {
    // Reference: the brief's misuse cases (duplicate joint id, zero-length axis)
    const dup: MechanismSpec = { ...base, joints: [...base.joints, ...base.joints] };
    expect(validateMechanism(dup)).toEqual([expect.objectContaining({ code: 'duplicate-joint', id: 'O2' })]);
    const zeroAxis: MechanismSpec = {
      ...base,
      joints: [
        ...base.joints,
        {
          kind: 'prismatic',
          id: 'S',
          bodyI: 'die_body',
          pointI: [0, 0],
          axisI: [0, 0],
          bodyJ: 'crank',
          pointJ: [0, 0],
          axisJ: [1, 0],
        },
      ],
    };
    expect(validateMechanism(zeroAxis)).toEqual([expect.objectContaining({ code: 'zero-axis', id: 'S' })]);
    expect(() => defineMechanism(zeroAxis)).toThrow(/prismatic joint 'S' has a zero-length axis/);
    const noGround: MechanismSpec = { bodies: [{ id: 'p', kind: 'plate' }], joints: [] };
    expect(validateMechanism(noGround).map((p) => p.code)).toEqual(['no-die-body']);
  });

  it('validateMechanism(driver on an unknown joint, self-joint, two die bodies) reports each', () => {
    // Reference: programmer misuse is reported, never silently accepted
    expect(validateMechanism({ ...base, drivers: [{ id: 'm', joint: 'nope' }] })).toEqual([
      expect.objectContaining({ code: 'unknown-joint', id: 'm' }),
    ]);
    const self: MechanismSpec = {
      ...base,
      joints: [
        ...base.joints,
        { kind: 'revolute', id: 'Z', bodyI: 'crank', pointI: [0, 0], bodyJ: 'crank', pointJ: [1, 0] },
      ],
    };
    expect(validateMechanism(self)).toEqual([expect.objectContaining({ code: 'self-joint', id: 'Z' })]);
    const two: MechanismSpec = { ...base, bodies: [...base.bodies, { id: 'frame', kind: 'die_body' }] };
    expect(validateMechanism(two).map((p) => p.code)).toContain('several-die-bodies');
  });
});
