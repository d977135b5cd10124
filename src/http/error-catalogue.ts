/**
 * Every HTTP error the service returns, with its status, meaning and how to fix it. api-spec/errors.md documents the
 * same list; a test keeps the two in step.
 */
export const ERROR_CATALOGUE = Object.freeze({
  invalid_schedule: {
    status: 400,
    meaning: 'The schedule does not match the wire format or describes an impossible die.',
    fix: 'Read `details`: each entry names the field (e.g. `stations[2].orifice.outer`) and what is wrong with it.',
  },
  malformed_json: {
    status: 400,
    meaning: 'The request body is not valid JSON.',
    fix: 'Send a JSON document with `Content-Type: application/json`; check for trailing commas and unquoted names.',
  },
  malformed_request: {
    status: 400,
    meaning:
      'The request itself cannot be read: a URL with a broken percent-escape, or a body that does not match its Content-Length.',
    fix: 'Percent-encode the URL properly (e.g. `%20`, not `%zz`) and let the HTTP client set Content-Length.',
  },
  request_timeout: {
    status: 408,
    meaning:
      'The request (headers and body) did not arrive completely within 30 s; the connection is closed without reading more.',
    fix: 'Send the whole request at once (the body is at most 5 MiB); over a slow link, resample dense outlines first.',
  },
  headers_too_large: {
    status: 431,
    meaning: 'The request headers exceed 16 KiB in all; the connection is closed.',
    fix: 'Send fewer or shorter headers: a bearer token and an Idempotency-Key (at most 128 characters) fit easily.',
  },
  unsupported_media_type: {
    status: 415,
    meaning: 'The request body is not JSON.',
    fix: 'Send the schedule as `application/json`.',
  },
  body_too_large: {
    status: 413,
    meaning: 'The request body exceeds the size limit (5 MiB).',
    fix: 'Send fewer stations or fewer vertices per ring; resample dense CAD outlines before posting.',
  },
  not_found: {
    status: 404,
    meaning: 'No such route or resource.',
    fix: 'Check the path and the id; a deleted plan is gone.',
  },
  unauthorized: {
    status: 401,
    meaning: 'The service has API tokens and the request carries none, or one it does not know.',
    fix: 'Send `Authorization: Bearer <token>` with a token the service owners gave you.',
  },
  forbidden: {
    status: 403,
    meaning: 'The token is known but its scope does not allow this: a `read` token cannot post or delete plans.',
    fix: 'Use a token with the `write` scope for `POST /v1/plans` and `DELETE /v1/plans/{id}`.',
  },
  not_ready: {
    status: 409,
    meaning: 'The plan is still queued or running: it has no result to download yet.',
    fix: 'Poll `GET /v1/plans/{id}` (it shows `status` and `progress`) until it is `done`, `incomplete` or `failed`; `Retry-After` says when to look again.',
  },
  no_motion: {
    status: 409,
    meaning: 'The plan has no actuator motion to download: it failed, or its mechanism has no actuators.',
    fix: 'Read the plan (`GET /v1/plans/{id}`): its `error`, `outcome.shortfalls` and findings say why; change the schedule and plan again.',
  },
  no_mechanism: {
    status: 409,
    meaning:
      'The plan has no mechanism to draw (plates, die body, stations, preview): it failed before a chain was fitted.',
    fix: 'Read the plan (`GET /v1/plans/{id}`): its `error` and findings say why; change the schedule and plan again.',
  },
  table_too_large: {
    status: 409,
    meaning:
      'The setpoint table would have more than 200 000 rows (time step too fine for the repeat or stations span).',
    fix: 'Plan again with a longer `time_step_s`, or use the cam table (`/cam-table.csv?points=N`).',
  },
  plan_too_large: {
    status: 422,
    meaning:
      'The schedule is too large for one plan: its station boundaries add up to more than the plan work limit (the chain fit grows with the boundary length of every station), which bounds how long a plan holds a worker.',
    fix: 'Send fewer stations (stations between which the profile changes little add little), or plan the schedule in parts; checks (`POST /v1/checks`) have no such limit.',
  },
  idempotency_conflict: {
    status: 422,
    meaning: 'The Idempotency-Key was used before with a different schedule.',
    fix: 'Use a new key for a new schedule; repeat a key only to repeat the same request (same schedule, any formatting).',
  },
  rate_limited: {
    status: 429,
    meaning: 'Too many requests in a short time.',
    fix: 'Wait the number of seconds in the `Retry-After` header and try again.',
  },
  service_busy: {
    status: 503,
    meaning:
      'Too many posted schedules (checks and plans) or downloads are waiting for a worker, or the service is shutting down.',
    fix: 'Wait the seconds in `Retry-After` and try again.',
  },
  internal: {
    status: 500,
    meaning: 'The service failed unexpectedly; nothing was stored.',
    fix: 'Report the `request_id` from the response to the service owners.',
  },
} as const);

export type ErrorCode = keyof typeof ERROR_CATALOGUE;

/** One entry of an error's `details`: the field's path and what is wrong with it. */
export interface ErrorDetail {
  readonly path: string;
  readonly message: string;
}

/** The body of every error response. */
export interface ErrorBody {
  readonly error: ErrorCode;
  readonly message: string;
  readonly details: ErrorDetail[];
  readonly request_id?: string;
}

/** Builds an error body from the catalogue. */
export function errorBody(code: ErrorCode, message: string, details: readonly ErrorDetail[] = []): ErrorBody {
  return { error: code, message, details: [...details] };
}
