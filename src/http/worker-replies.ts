import { ERROR_CATALOGUE, errorBody } from './error-catalogue.js';
import type { IntakeRefusal } from './schedule-intake.js';

/** Seconds a client is told (Retry-After) to wait when too many tasks wait for a worker. */
export const BUSY_RETRY_AFTER_S = 2;

/** The part of a reply these helpers use (fastify's, whatever the route's typed `send`). */
interface ReplyLike {
  header(name: string, value: string): unknown;
  code(status: number): { send(body: unknown): unknown };
}

/**
 * Answers 503 `service_busy` with Retry-After: too many `waiting` (e.g. "checks", "downloads") wait for a worker
 * already, so this one is refused rather than queued without bound.
 */
export function sendBusy<R extends ReplyLike>(reply: R, requestId: string, waiting: string): R {
  reply.header('retry-after', String(BUSY_RETRY_AFTER_S));
  reply.code(503).send({
    ...errorBody('service_busy', `Too many ${waiting} are waiting for a worker; try again in ${BUSY_RETRY_AFTER_S} s.`),
    request_id: requestId,
  });
  return reply;
}

/** Answers a posted schedule's refusal (see `readSchedule`) with its catalogue status. */
export function sendRefusal<R extends ReplyLike>(reply: R, requestId: string, refusal: IntakeRefusal): R {
  reply
    .code(ERROR_CATALOGUE[refusal.code].status)
    .send({ ...errorBody(refusal.code, refusal.message, refusal.details), request_id: requestId });
  return reply;
}
