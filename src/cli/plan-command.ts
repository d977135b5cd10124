import { mkdir, readFile, writeFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { pino } from 'pino';
import { buildApp } from '../app.js';
import { drawingModel, partIds } from '../export/index.js';

/** Where the command writes: its output streams, so tests can capture them. */
export interface CommandIo {
  readonly stdout: (text: string) => void;
  readonly stderr: (text: string) => void;
  /** True when stderr is a terminal: the progress line is then rewritten in place. */
  readonly interactive: boolean;
}

export const USAGE = `usage: npm run plan -- <schedule.json> --out <dir> [--json] [--time-limit <s>]

Plans a schedule offline with the service's own pipeline and routes, and writes into <dir>:
  plan.json, check.json, every table (setpoints, cam table, …) and every drawing (DXF, SVG) the plan has.
  --json         print a summary as JSON on stdout (progress stays on stderr)
  --time-limit   seconds after which the chain search stops with what it has (default PLAN_TIME_LIMIT_S or 20)
Exit code: 0 the plan meets the request; 1 it is incomplete or failed (files are still written); 2 bad input.`;

/** Exit codes of `npm run plan`. */
export const EXIT = Object.freeze({ done: 0, shortOfRequest: 1, badInput: 2 });

/**
 * `npm run plan -- <schedule.json> --out <dir>`: the schedule goes through the same app the service runs (validation,
 * worker pool, pipeline, every download route), driven in-process without a network, and every download a finished
 * plan offers is written to `<dir>`. Returns the exit code.
 */
export async function runPlanCommand(argv: readonly string[], io: CommandIo): Promise<number> {
  let parsed: ReturnType<typeof parse>;
  try {
    parsed = parse(argv);
  } catch (err) {
    io.stderr(`${err instanceof Error ? err.message : String(err)}\n\n${USAGE}\n`);
    return EXIT.badInput;
  }
  const { file, out, json, timeLimitS } = parsed;
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch (err) {
    io.stderr(`cannot read ${file}: ${(err as NodeJS.ErrnoException).code ?? String(err)}\n`);
    return EXIT.badInput;
  }
  const app = await buildApp({ logger: pino({ level: 'silent' }), planWorkers: 1, planTimeLimitS: timeLimitS });
  await app.ready();
  try {
    const created = await app.inject({
      method: 'POST',
      url: '/v1/plans',
      headers: { 'content-type': 'application/json' },
      payload: text,
    });
    if (created.statusCode !== 202) {
      io.stderr(describeError(file, created.json()));
      return EXIT.badInput;
    }
    const { id } = created.json() as { id: string };
    const plan = await follow(app, id, io);
    await mkdir(out, { recursive: true });
    const files: string[] = [];
    const write = async (name: string, body: string | Buffer) => {
      await mkdir(join(out, name, '..'), { recursive: true });
      await writeFile(join(out, name), body);
      files.push(name);
    };
    await write('plan.json', `${JSON.stringify(plan, null, 2)}\n`);
    const check = await app.inject({
      method: 'POST',
      url: '/v1/checks',
      headers: { 'content-type': 'application/json' },
      payload: text,
    });
    if (check.statusCode === 200) await write('check.json', `${JSON.stringify(check.json(), null, 2)}\n`);
    const skipped: string[] = [];
    for (const name of downloadNames(app, id)) {
      const res = await app.inject({ method: 'GET', url: `/v1/plans/${id}/${name}` });
      if (res.statusCode === 200) await write(name, res.rawPayload);
      else skipped.push(`${name}: ${(res.json() as { message?: string }).message ?? res.statusCode}`);
    }
    const status = plan.status as string;
    const summary = {
      status,
      meets_request: (plan.outcome as { meets_request: boolean }).meets_request,
      shortfalls: (plan.outcome as { shortfalls: string[] }).shortfalls,
      error: plan.error ?? null,
      out: resolve(out),
      files,
      not_written: skipped,
      cautions: (plan.cautions as { code: string }[]).map((c) => c.code),
    };
    if (json) io.stdout(`${JSON.stringify(summary, null, 2)}\n`);
    else {
      io.stdout(`plan ${status}: ${files.length} files in ${summary.out}\n`);
      for (const f of files) io.stdout(`  ${f}\n`);
      for (const s of skipped) io.stdout(`  not written: ${s}\n`);
      for (const s of summary.shortfalls) io.stdout(`  short of the request: ${s}\n`);
      io.stdout(`safety cautions (in plan.json): ${summary.cautions.join(', ')}\n`);
    }
    return status === 'done' ? EXIT.done : EXIT.shortOfRequest;
  } finally {
    await app.close();
  }
}

function parse(argv: readonly string[]) {
  const { values, positionals } = parseArgs({
    args: [...argv],
    allowPositionals: true,
    options: {
      out: { type: 'string', short: 'o' },
      json: { type: 'boolean', default: false },
      'time-limit': { type: 'string' },
    },
  });
  if (positionals.length !== 1) throw new Error('give exactly one schedule file');
  if (!values.out) throw new Error('give the output directory with --out <dir>');
  const limitText = values['time-limit'] ?? process.env.PLAN_TIME_LIMIT_S ?? '20';
  const timeLimitS = Number(limitText);
  if (!(Number.isFinite(timeLimitS) && timeLimitS > 0))
    throw new Error(`--time-limit must be seconds above 0, got "${limitText}"`);
  return { file: positionals[0]!, out: values.out, json: values.json ?? false, timeLimitS };
}

type App = Awaited<ReturnType<typeof buildApp>>;

/** Polls the plan until it has finished, drawing a progress line on stderr; returns its report. */
async function follow(app: App, id: string, io: CommandIo): Promise<Record<string, unknown>> {
  let last = '';
  for (;;) {
    const plan = (await app.inject({ method: 'GET', url: `/v1/plans/${id}` })).json() as Record<string, unknown>;
    const status = plan.status as string;
    const progress = plan.progress as { stage: string; fraction: number } | null;
    const line =
      status === 'queued' || status === 'running'
        ? `planning: ${progress?.stage ?? status} ${Math.round((progress?.fraction ?? 0) * 100)}%`
        : `planning: ${status}`;
    if (line !== last) {
      io.stderr(io.interactive ? `\r\x1b[K${line}` : `${line}\n`);
      last = line;
    }
    if (status !== 'queued' && status !== 'running') {
      if (io.interactive) io.stderr('\n');
      return plan;
    }
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Every download of a plan the app offers (from its OpenAPI paths), parts one by one. */
function downloadNames(app: App, id: string): string[] {
  const prefix = '/v1/plans/{id}/';
  const paths = Object.keys((app.swagger() as { paths: Record<string, unknown> }).paths).filter((p) =>
    p.startsWith(prefix),
  );
  const names: string[] = [];
  for (const path of paths) {
    const rest = path.slice(prefix.length);
    if (!rest.includes('{')) {
      names.push(rest);
      continue;
    }
    // a route per part: one file per part the plan's drawing has
    const record = app.plans.store.get(id);
    const made = record ? drawingModel(record.plan, record.schedule) : null;
    if (made?.ok) for (const part of partIds(made.model)) names.push(rest.replace(/\{[^}]+\}/, part));
  }
  return names;
}

function describeError(
  file: string,
  body: { error?: string; message?: string; details?: { path: string; message: string }[] },
): string {
  const lines = [`${file} cannot be planned (${body.error ?? 'error'}): ${body.message ?? ''}`];
  for (const d of body.details ?? []) lines.push(`  ${d.path}: ${d.message}`);
  return `${lines.join('\n')}\n`;
}
