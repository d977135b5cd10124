import type { FastifyReply, FastifyRequest } from 'fastify';
import type { Schedule } from '../domain/index.js';
import { errorBody } from './error-catalogue.js';
import type { ScheduleWireValue } from './schedule-schema.js';
import { toSchedule } from './to-schedule.js';

/**
 * Maps a zod-valid body to a domain schedule, or answers 400 `invalid_schedule` with every problem's field path and
 * returns null (the route then stops: nothing is computed or stored).
 */
export function scheduleOrReject(
  body: ScheduleWireValue,
  request: FastifyRequest,
  reply: FastifyReply,
): Schedule | null {
  const mapped = toSchedule(body);
  if (mapped.ok) return mapped.schedule;
  void reply.code(400).send({
    ...errorBody(
      'invalid_schedule',
      'The schedule describes an orifice or a station order the die cannot make.',
      mapped.problems,
    ),
    request_id: request.id,
  });
  return null;
}
