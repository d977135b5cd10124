/**
 * The smallest plan request of the README: a strip 40 mm wide whose top rises from 8 mm at 0 m to `topMm` at 0.5 m
 * (rectangles, counter-clockwise, y up). It plans in well under a second, so tests of the service use it where the
 * plan's content does not matter.
 */
export function stripSchedule(topMm: number, name = 'small-strip') {
  const rectangle = (h: number): [number, number][] => [
    [0, 0],
    [40, 0],
    [40, h],
    [0, h],
  ];
  return {
    name,
    stations: [
      { position_m: 0, orifice: { outer: rectangle(8) } },
      { position_m: 0.5, orifice: { outer: rectangle(topMm) } },
    ],
  };
}
