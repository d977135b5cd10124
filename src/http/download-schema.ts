import { z } from 'zod';
import { CautionWire } from './report-schema.js';

const MotionMetaFields = {
  schedule: z.string().describe('name of the schedule the plan was made from'),
  law: z
    .enum(['cycloidal', 'polynomial-345', 'monotone-cubic'])
    .describe('motion law between stations; cycloidal: rest-to-rest over each transition (VDI 2143 Blatt 1)'),
  periodic: z
    .boolean()
    .describe(
      'true: the table covers one repeat (repeat_length_m) and its last row is its first one repeat on, so it closes on itself; false: from the first to the last station',
    ),
  units: z
    .record(z.string(), z.string())
    .describe('unit of every column: m, s, deg, mm, deg/m or mm/m (a cam slope per metre of line)'),
  columns: z.array(z.string()).describe('column names, in the order of every row (the CSV header)'),
  cautions: z.array(CautionWire).describe('process-safety cautions; they travel with every export'),
};

const StationSetpointWire = z.object({
  position_m: z.number().describe('station line position, m'),
  values: z.array(z.number()).describe('each actuator at the station: degrees (rotary) or mm (linear)'),
});

export const SetpointsWire = z
  .object({
    ...MotionMetaFields,
    time_step_s: z.number().describe('time between rows, s (the schedule’s time_step_s; the last step may be shorter)'),
    rows: z
      .array(z.array(z.number()))
      .describe('one row per time step: position_m, time_s, then each actuator (degrees or mm); as in setpoints.csv'),
  })
  .describe('actuator setpoints against line position and time');

export const CamTableWire = z
  .object({
    ...MotionMetaFields,
    points: z.number().int().describe('number of master positions (rows)'),
    stations: z.array(StationSetpointWire).describe('the station values every actuator passes through'),
    rows: z
      .array(z.array(z.number()))
      .describe(
        'one row per master position: position_m (strictly increasing), then per actuator its value and its slope d(value)/d(position) per metre of line; as in cam-table.csv',
      ),
  })
  .describe('electronic cam: master line position against actuator values and slopes (PLCopen MC_CamIn style)');

/** `?points=N` of the cam table. */
export const CamTableQuery = z.object({
  points: z
    .string()
    .optional()
    .describe('number of master positions, an integer 2–10001; default 101 (else 400 malformed_request)'),
});

export const PlanIdParams = z.object({ id: z.string().describe('plan id from POST /v1/plans') });
