import { serializerCompiler } from 'fastify-type-provider-zod';
import secureJsonParse from 'secure-json-parse';
import type { Finding, Schedule } from '../domain/index.js';
import { ringPerimeter } from '../geometry/index.js';
import { checkSchedule } from '../pipeline/index.js';
import { type ScheduleHead, scheduleHash, scheduleParts } from '../store/index.js';
import type { ErrorCode, ErrorDetail } from './error-catalogue.js';
import { formatInstancePath } from './field-path.js';
import { unreadableFigure } from './readable-report.js';
import { CheckReportWire } from './report-schema.js';
import { ScheduleWire } from './schedule-schema.js';
import { spanEndProblems } from './span-end-problems.js';
import { toCheckReport, toFindingWire } from './to-check-report.js';
import { toSchedule } from './to-schedule.js';
import { unknownFields } from './unknown-fields.js';
import { type ScheduleRoute, unusedFields } from './unused-fields.js';

/**
 * Largest total outer-boundary length of a schedule's stations a plan may fit, mm: about 180 stations of the demo
 * strip (about 110 mm of boundary each). Measured on a 2-core machine: 100 such stations plan in about 6 s, 400 in
 * about 55 s (README), so one plan holds a worker for about half a minute at most.
 */
export const PLAN_BOUNDARY_LIMIT_MM = 20_000;

/** The errors of the catalogue a posted schedule can be refused with. */
export type IntakeRefusalCode = Extract<ErrorCode, 'malformed_json' | 'invalid_schedule' | 'plan_too_large'>;

/** Why a posted schedule is refused: an error of the catalogue with its message and the fields at fault. */
export interface IntakeRefusal {
  readonly ok: false;
  readonly code: IntakeRefusalCode;
  readonly message: string;
  readonly details: readonly ErrorDetail[];
}

/** A schedule read from a request body: valid, mapped to domain units, with findings about the request itself. */
export interface ScheduleRead {
  readonly ok: true;
  readonly schedule: Schedule;
  /** Unknown fields (warnings) and fields the route does not use (info), in that order. */
  readonly requestFindings: readonly Finding[];
}

/** A checked schedule: the `POST /v1/checks` report as sent, and two figures for the log. */
export interface CheckAnswer {
  readonly ok: true;
  readonly reportJson: string;
  readonly stations: number;
  readonly findings: number;
}

/** A schedule ready to be stored and queued as a plan: encoded for the store, hashed, its head for the 202. */
export interface PlanIntake {
  readonly ok: true;
  /** The schedule, packed by `packJson` (as the store keeps it). */
  readonly schedulePacked: Uint8Array;
  readonly scheduleHash: string;
  readonly head: ScheduleHead;
  readonly requestFindings: readonly Finding[];
}

/**
 * Reads a posted schedule from the body's text, everything the service does before it computes: JSON (refusing
 * `__proto__` and `constructor.prototype` keys, as the framework's own parser does), the wire format (zod), the
 * unknown and unused fields, the mapping to domain units (ring validity, station order, vertex limits) and the
 * explicit moving-span ends. Pure and synchronous; the routes run it in a worker thread, because for a body at the
 * vertex limit (200,000 vertices, about 3.5 MB) it takes a second or more, which the service thread must not wait.
 */
export function readSchedule(text: string, route: ScheduleRoute): IntakeRefusal | ScheduleRead {
  let body: unknown;
  try {
    body = secureJsonParse.parse(text, undefined, { protoAction: 'error', constructorAction: 'error' });
  } catch {
    return refuse(
      'malformed_json',
      'The body is not valid JSON, or it carries a "__proto__" or "constructor": { "prototype": … } key, which is refused.',
    );
  }
  const parsed = ScheduleWire.safeParse(body);
  if (!parsed.success) {
    return refuse(
      'invalid_schedule',
      'The schedule does not match the expected format.',
      parsed.error.issues.map((issue) => ({
        path: formatInstancePath(`/${issue.path.map(String).join('/')}`),
        message: issue.message,
      })),
    );
  }
  const mapped = toSchedule(parsed.data);
  const problems = mapped.ok ? spanEndProblems(mapped.schedule) : mapped.problems;
  if (!mapped.ok || problems.length > 0) {
    return refuse(
      'invalid_schedule',
      'The schedule describes an orifice or a station order the die cannot make.',
      problems,
    );
  }
  return {
    ok: true,
    schedule: mapped.schedule,
    requestFindings: [...unknownFields(body, ScheduleWire), ...unusedFields(body, route)],
  };
}

const sendCheckReport = serializerCompiler({ schema: CheckReportWire, method: 'POST', url: '/v1/checks' });

/**
 * `POST /v1/checks` from the body's text to the report's JSON: read, checked, the request's own findings first, and
 * written as the route's response schema writes it. A report with a figure that is not finite is refused (400 naming
 * `process`), since JSON cannot carry it.
 */
export function checkBody(text: string): IntakeRefusal | CheckAnswer {
  const read = readSchedule(text, 'checks');
  if (!read.ok) return read;
  const mapped = toCheckReport(read.schedule, checkSchedule(read.schedule));
  const report = { ...mapped, findings: [...read.requestFindings.map(toFindingWire), ...mapped.findings] };
  const unreadable = unreadableFigure(report);
  if (unreadable) {
    return refuse('invalid_schedule', 'The schedule gives figures that cannot be computed as finite numbers.', [
      {
        path: 'process',
        message: `these process values and orifices give ${unreadable.path} that is not a finite number (${unreadable.problem}); bring the values nearer to common practice`,
      },
    ]);
  }
  return {
    ok: true,
    reportJson: sendCheckReport(report),
    stations: report.stations.length,
    findings: report.findings.length,
  };
}

/**
 * `POST /v1/plans` from the body's text to what the store queues: the schedule read, at least two stations, within
 * the plan size limit, encoded and hashed.
 */
export function planBody(text: string): IntakeRefusal | PlanIntake {
  const read = readSchedule(text, 'plans');
  if (!read.ok) return read;
  const { schedule } = read;
  if (schedule.stations.length < 2) {
    return refuse('invalid_schedule', 'A plan needs at least two stations.', [
      { path: 'stations', message: 'a plan needs at least 2 stations: with one there is nothing to move' },
    ]);
  }
  // the chain fit's work grows with every station's boundary length: refuse what would hold a worker too long
  const boundaryMm = schedule.stations.reduce((sum, s) => sum + ringPerimeter(s.orifice.outer), 0);
  if (boundaryMm > PLAN_BOUNDARY_LIMIT_MM) {
    const m = Math.round(boundaryMm / 1000);
    return refuse(
      'plan_too_large',
      `The stations' boundaries add up to ${m} m, more than the ${PLAN_BOUNDARY_LIMIT_MM / 1000} m one plan may fit.`,
      [
        {
          path: 'stations',
          message: `${schedule.stations.length} stations with ${m} m of boundary in all: send fewer stations or plan the schedule in parts (at most ${PLAN_BOUNDARY_LIMIT_MM / 1000} m)`,
        },
      ],
    );
  }
  return {
    ok: true,
    ...scheduleParts(schedule),
    scheduleHash: scheduleHash(schedule),
    requestFindings: read.requestFindings,
  };
}

function refuse(code: IntakeRefusalCode, message: string, details: readonly ErrorDetail[] = []): IntakeRefusal {
  return { ok: false, code, message, details };
}
