import type { FastifyReply, FastifyRequest } from 'fastify';
import type { Finding, Schedule } from '../domain/index.js';
import { errorBody } from './error-catalogue.js';
import { ScheduleWire, type ScheduleWireValue } from './schedule-schema.js';
import { spanEndProblems } from './span-end-problems.js';
import { toSchedule } from './to-schedule.js';
import { unknownFields } from './unknown-fields.js';
import { type ScheduleRoute, unusedFields } from './unused-fields.js';

/** Bodies as they arrived, before zod dropped unknown fields; filled by `keepRawBody`. */
const rawBodies = new WeakMap<FastifyRequest, unknown>();

/** preValidation hook of the schedule routes: keeps the body as sent, so unknown fields can be reported. */
export async function keepRawBody(request: FastifyRequest): Promise<void> {
  rawBodies.set(request, request.body);
}

/**
 * Warnings for fields of the request's schedule that the format does not know (see `unknownFields`), then notes on
 * the fields it knows but the route does not use (see `unusedFields`).
 */
export function unknownScheduleFields(request: FastifyRequest, route: ScheduleRoute): Finding[] {
  const body = rawBodies.get(request);
  return [...unknownFields(body, ScheduleWire), ...unusedFields(body, route)];
}

/**
 * Maps a zod-valid body to a domain schedule, or answers 400 `invalid_schedule` with every problem's field path (a
 * bad ring, the station order, an explicit moving-span end off a station's boundary) and returns null (the route then
 * stops: nothing is computed or stored).
 */
export function scheduleOrReject(
  body: ScheduleWireValue,
  request: FastifyRequest,
  reply: FastifyReply,
): Schedule | null {
  const mapped = toSchedule(body);
  const problems = mapped.ok ? spanEndProblems(mapped.schedule) : mapped.problems;
  if (mapped.ok && problems.length === 0) return mapped.schedule;
  void reply.code(400).send({
    ...errorBody(
      'invalid_schedule',
      'The schedule describes an orifice or a station order the die cannot make.',
      problems,
    ),
    request_id: request.id,
  });
  return null;
}
