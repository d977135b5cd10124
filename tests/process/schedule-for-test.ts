import type { MaterialName, Schedule } from '../../src/domain/index.js';

/** A rectangular station `w` × `h` mm at line position `positionM`. */
function rectangle(index: number, positionM: number, w: number, h: number) {
  return {
    index,
    positionM,
    orifice: {
      outer: [
        [0, 0],
        [w, 0],
        [w, h],
        [0, h],
      ] as const,
      holes: [],
    },
  };
}

/**
 * A small schedule for the process checks, in domain units (kg/s, kg/m³, m/s, Pa·sⁿ). Every process value is given
 * here, so tests state their own numbers instead of taking a preset's.
 */
export function scheduleForTest(
  over: {
    material?: MaterialName;
    process?: Partial<Schedule['process']>;
    limits?: Partial<Schedule['limits']>;
    stations?: number;
  } = {},
): Schedule {
  const count = over.stations ?? 1;
  return {
    name: 'test',
    material: over.material ?? 'custom',
    process: {
      lineSpeedMPerS: 0.05,
      throughputKgPerS: null,
      meltDensityKgPerM3: 1000,
      solidDensityKgPerM3: 1000,
      dieSwell: 1,
      powerLawN: 1,
      powerLawMPaSn: 1000,
      dieTemperatureC: 200,
      dieLandLengthMm: 20,
      ...over.process,
    },
    limits: {
      drawDownMin: 1.0,
      drawDownMax: 1.3,
      minWallMm: 1,
      maxWallRatio: 2.5,
      fitToleranceMm: 0.1,
      maxPlates: 24,
      minPlates: 1,
      plateCount: null,
      ...over.limits,
    },
    plates: { pivotHoleDiameterMm: 4, ligamentMm: 3, thicknessMm: 6, depthMm: 25 },
    links: { minLengthMm: 7, maxLengthMm: 200 },
    actuators: { count: 1, maxSpeedRadPerS: 1, maxAccelRadPerS2: 5, maxSpeedMmPerS: 50, maxAccelMmPerS2: 250 },
    timeStepS: 0.05,
    repeatLengthM: null,
    movingSpan: { ends: null, matchToleranceMm: 0.02 },
    stations: Array.from({ length: count }, (_, i) => rectangle(i, i, 50, 2)),
  };
}
