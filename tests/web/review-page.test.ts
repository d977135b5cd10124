import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { pino } from 'pino';
import { type Browser, chromium, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../src/app.js';
import { stripSchedule } from '../support/strip-schedule.js';

/**
 * The review page in a real browser (Debian's chromium, never downloaded): the service listens on a loopback port,
 * the demo schedule is planned, and the page is driven as a reader would.
 */
const CHROMIUM = '/usr/bin/chromium';
const hasChromium = existsSync(CHROMIUM);
const OUT = new URL('../../.ci/out/', import.meta.url);
const FINISHED = new Set(['done', 'incomplete', 'failed']);
/** The smallest plan request (README): a 40 mm strip whose top rises from 8 to 12 mm; it plans in well under a second. */
const SMALL_SCHEDULE = stripSchedule(12);
/** How far a drawn pin may lie from the plan's position, mm (the drawing keeps 0.1 µm). */
const TOLERANCE_MM = 1e-3;

type Point = [number, number];
type Plan = {
  id: string;
  status: string;
  stations: { position_m: number }[];
  findings: { code: string; position_m?: number; station?: number }[];
  cautions: { code: string; hazard: string }[];
  mechanism: { joints: { id: string; station_positions: Point[] }[] };
};
type Motion = {
  position_m: number[];
  joints: { id: string; positions_mm: Point[] }[];
  plates: { id: string; pivots: [string, string]; outline_local_mm: Point[] }[];
};

let app: Awaited<ReturnType<typeof buildApp>>;
let base = '';
let browser: Browser;
let page: Page;
let plan: Plan;
let motion: Motion | null = null;

async function finishedPlan(id: string): Promise<Plan> {
  for (let i = 0; i < 900; i++) {
    const body = (await (await fetch(`${base}/v1/plans/${id}`)).json()) as Plan;
    if (FINISHED.has(body.status)) return body;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`plan ${id} did not finish`);
}

/** The drawn position of a pin, mm in the die-body frame, read from its data attributes. */
async function drawnPin(joint: string): Promise<Point> {
  const pin = page.locator(`circle[data-joint="${joint}"]`);
  return [Number(await pin.getAttribute('data-x')), Number(await pin.getAttribute('data-y'))];
}

async function shownPosition(): Promise<number> {
  return Number(await page.locator('#readout').getAttribute('data-position'));
}

describe.skipIf(!hasChromium)(
  `review page in chromium${hasChromium ? '' : ' (skipped: /usr/bin/chromium is absent)'}`,
  () => {
    beforeAll(async () => {
      app = await buildApp({ logger: pino({ level: 'silent' }) });
      await app.listen({ host: '127.0.0.1', port: 0 });
      base = `http://127.0.0.1:${(app.server.address() as AddressInfo).port}`;
      const posted = await fetch(`${base}/v1/plans`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: readFileSync(new URL('../../fixtures/demo-edging-strip.json', import.meta.url), 'utf8'),
      });
      expect(posted.status).toBe(202);
      plan = await finishedPlan(((await posted.json()) as { id: string }).id);
      const m = await fetch(`${base}/v1/plans/${plan.id}/motion.json`);
      motion = m.ok ? ((await m.json()) as Motion) : null;
      browser = await chromium.launch({
        executablePath: CHROMIUM,
        args: [
          '--headless',
          '--no-sandbox',
          '--disable-gpu',
          '--disable-quic',
          '--no-first-run',
          '--disable-background-networking',
          '--disable-component-update',
          '--disable-sync',
        ],
      });
      page = await browser.newPage({ viewport: { width: 1280, height: 860 } });
      await page.goto(`${base}/plans/${plan.id}`);
      await page.locator('#position').waitFor({ timeout: 30_000 });
      // generous bounds: alone this takes about 15 s; the whole suite at once on 2 cores is slower
    }, 120_000);

    afterAll(async () => {
      await browser?.close();
      await app?.close();
    });

    it('the demo plan is done and its page loads with no script error', async () => {
      expect(plan.status).toBe('done');
      const errors: string[] = [];
      page.on('pageerror', (e) => errors.push(e.message));
      // a strict Content-Security-Policy (helmet's) refuses inline script and style: the page must not need them
      page.on('console', (m) => {
        if (m.type() === 'error' && /Content Security Policy|Refused to/.test(m.text())) errors.push(m.text());
      });
      await page.reload();
      await page.locator('#position').waitFor();
      expect(errors).toEqual([]);
      await expect(page.locator('h1').textContent()).resolves.toContain('edging-strip-demo');
    });

    it('moving the slider to each station draws every pin where the plan puts it at that station', async () => {
      for (const [k, station] of plan.stations.entries()) {
        await page.locator('#position').fill(String(station.position_m));
        expect(await shownPosition()).toBeCloseTo(station.position_m, 9);
        for (const joint of plan.mechanism.joints) {
          const [x, y] = await drawnPin(joint.id);
          const want = joint.station_positions[k]!;
          expect(Math.hypot(x - want[0], y - want[1]), `${joint.id} at station ${k}`).toBeLessThan(TOLERANCE_MM + 1e-3);
        }
      }
    });

    it('between stations the pins are where the plan’s motion puts them (or on the way between the two stations)', async () => {
      const x = 0.5; // between station 1 (0.375 m) and station 2 (0.75 m)
      await page.locator('#position').fill(String(x));
      expect(await shownPosition()).toBeCloseTo(x, 9);
      for (const joint of plan.mechanism.joints) {
        const drawn = await drawnPin(joint.id);
        if (motion) {
          const samples = motion.joints.find((j) => j.id === joint.id)!.positions_mm;
          const i = motion.position_m.findIndex((p, n) => p <= x && (motion!.position_m[n + 1] ?? p) >= x);
          const [x0, x1] = [motion.position_m[i]!, motion.position_m[i + 1]!];
          const t = x1 > x0 ? (x - x0) / (x1 - x0) : 0;
          const [a, b] = [samples[i]!, samples[i + 1]!];
          const want = [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t];
          expect(Math.hypot(drawn[0] - want[0]!, drawn[1] - want[1]!), joint.id).toBeLessThan(TOLERANCE_MM);
        } else {
          const [a, b] = [joint.station_positions[1]!, joint.station_positions[2]!];
          const len2 = (b[0] - a[0]) ** 2 + (b[1] - a[1]) ** 2;
          const t = len2 > 0 ? ((drawn[0] - a[0]) * (b[0] - a[0]) + (drawn[1] - a[1]) * (b[1] - a[1])) / len2 : 0;
          expect(t).toBeGreaterThanOrEqual(-1e-9);
          expect(t).toBeLessThanOrEqual(1 + 1e-9);
          const off = Math.hypot(drawn[0] - (a[0] + t * (b[0] - a[0])), drawn[1] - (a[1] + t * (b[1] - a[1])));
          expect(off, joint.id).toBeLessThan(TOLERANCE_MM);
        }
      }
      // each plate is drawn on its own two pivots
      const plate = page.locator('polygon[data-plate="plate_2"]');
      const a: Point = [Number(await plate.getAttribute('data-a-x')), Number(await plate.getAttribute('data-a-y'))];
      const pivot1 = await drawnPin('pivot_1');
      expect(Math.hypot(a[0] - pivot1[0], a[1] - pivot1[1])).toBeLessThan(1e-3);
      if (motion) {
        // its outline is the plan's own outline turned onto the pivot line (x from the first pivot to the second)
        const b: Point = [Number(await plate.getAttribute('data-b-x')), Number(await plate.getAttribute('data-b-y'))];
        const angle = Math.atan2(b[1] - a[1], b[0] - a[0]);
        const local = motion.plates.find((p) => p.id === 'plate_2')!.outline_local_mm;
        const drawn = ((await plate.getAttribute('points')) ?? '').split(' ').map((xy) => xy.split(',').map(Number));
        expect(drawn).toHaveLength(local.length);
        local.forEach(([lx, ly], i) => {
          const want = [
            a[0] + lx * Math.cos(angle) - ly * Math.sin(angle),
            a[1] + lx * Math.sin(angle) + ly * Math.cos(angle),
          ];
          expect(Math.hypot(drawn[i]![0]! - want[0]!, drawn[i]![1]! - want[1]!)).toBeLessThan(2e-3);
        });
      }
    });

    it('without the sampled motion (404) the page draws from the stations, every pin still where the plan puts it', async () => {
      const tab = await browser.newPage({ viewport: { width: 1024, height: 800 } });
      await tab.route('**/motion.json', (route) => route.fulfill({ status: 404, body: '{}' }));
      await tab.goto(`${base}/plans/${plan.id}`);
      await tab.locator('#position').waitFor({ timeout: 30_000 });
      await expect(tab.locator('section.card:has(#drawing-title-h) p.note').first().textContent()).resolves.toContain(
        'Drawn from the plan’s stations',
      );
      const station = plan.stations[2]!;
      await tab.locator('#position').fill(String(station.position_m));
      for (const joint of plan.mechanism.joints) {
        const pin = tab.locator(`circle[data-joint="${joint.id}"]`);
        const drawn = [Number(await pin.getAttribute('data-x')), Number(await pin.getAttribute('data-y'))];
        const want = joint.station_positions[2]!;
        expect(Math.hypot(drawn[0]! - want[0], drawn[1]! - want[1]), joint.id).toBeLessThan(TOLERANCE_MM);
      }
      await tab.close();
    });

    it('the slider moves by keyboard, and the drawing’s description follows it', async () => {
      const slider = page.locator('#position');
      await slider.focus();
      await page.keyboard.press('Home');
      expect(await shownPosition()).toBeCloseTo(plan.stations[0]!.position_m, 9);
      const step = Number(await slider.getAttribute('step'));
      for (let i = 0; i < 3; i++) await page.keyboard.press('ArrowRight');
      expect(await shownPosition()).toBeCloseTo(3 * step, 9);
      await expect(slider.getAttribute('aria-valuetext')).resolves.toMatch(/^0\.0\d\d m/);
      const desc = await page.locator('#drawing-desc').textContent();
      expect(desc).toContain(`At ${(3 * step).toFixed(3)} m of line.`);
      expect(desc).toMatch(/plate_1 from \(/);
    });

    it('play advances the line position and pause stops it', async () => {
      await page.locator('#position').fill('0');
      await page.locator('#speed').selectOption('50');
      const play = page.locator('#play');
      await play.press('Enter');
      await expect(play.getAttribute('aria-pressed')).resolves.toBe('true');
      // 50× a line speed of 2 m/min is 1.67 m/s of line: past 0.1 m within a tenth of a second of animation frames;
      // polled, not timed, since a loaded machine may give a headless page few frames
      await expect.poll(shownPosition, { timeout: 10_000 }).toBeGreaterThan(0.1);
      await play.click();
      await expect(play.getAttribute('aria-pressed')).resolves.toBe('false');
      const stopped = await shownPosition();
      await page.waitForTimeout(200);
      expect(await shownPosition()).toBe(stopped);
      // Space on the slider plays and pauses too
      await page.locator('#position').focus();
      await page.keyboard.press('Space');
      await expect(play.getAttribute('aria-pressed')).resolves.toBe('true');
      await expect.poll(shownPosition, { timeout: 10_000 }).not.toBe(stopped);
      await page.keyboard.press('Space');
      await expect(play.getAttribute('aria-pressed')).resolves.toBe('false');
    });

    it('findings are listed with their advice and marked on the charts; cautions stay on screen while scrolling', async () => {
      await expect(page.locator('#findings li.finding').count()).resolves.toBe(plan.findings.length);
      const located = plan.findings.filter((f) => f.position_m !== undefined || f.station !== undefined).length;
      const marked = await page
        .locator('figure.chart')
        .evaluateAll((els) => els.reduce((sum, el) => sum + Number(el.getAttribute('data-markers')), 0));
      expect(marked).toBe(located);
      await expect(page.locator('figure[data-chart="actuators_deg"] canvas').first().isVisible()).resolves.toBe(true);
      await page.locator('#downloads-title').scrollIntoViewIfNeeded();
      for (const caution of plan.cautions) {
        await expect(page.locator(`#cautions [data-caution="${caution.code}"]`).isVisible()).resolves.toBe(true);
      }
      const strip = await page.locator('#hazard-strip').boundingBox();
      expect(strip && strip.y >= 0 && strip.y < 200).toBe(true);
      const aside = await page.locator('#cautions h2').boundingBox();
      expect(aside && aside.y >= 0 && aside.y < 860).toBe(true);
      for (const name of [
        'setpoints.csv',
        'setpoints.json',
        'cam-table.csv',
        'plates.dxf',
        'die-body.dxf',
        'stations.dxf',
        'preview.svg',
        'motion.json',
      ]) {
        await expect(page.locator(`[data-download="${name}"] a`).getAttribute('href')).resolves.toBe(
          `/v1/plans/${plan.id}/${name}`,
        );
      }
      mkdirSync(OUT, { recursive: true });
      await page.locator('#position').fill('0.5');
      await page.mouse.wheel(0, -100_000);
      await page.screenshot({ path: new URL('review-page.png', OUT).pathname, fullPage: true });
    });

    it('a broken schedule posted from the list page shows the error next to the field it names', async () => {
      const list = await browser.newPage({ viewport: { width: 900, height: 1000 } });
      await list.goto(`${base}/`);
      await expect(list.locator(`tr[data-plan="${plan.id}"]`).count()).resolves.toBe(1);
      const broken = {
        name: 'broken',
        stations: [
          {
            position_m: 0,
            orifice: {
              outer: [
                [0, 0],
                [40, 0],
                [40, 8],
                [0, 8],
              ],
            },
          },
          {
            position_m: 0.5,
            orifice: {
              outer: [
                [0, 0],
                [40, 0],
              ],
            },
          },
        ],
      };
      await list.locator('#schedule-text').fill(JSON.stringify(broken));
      await list.locator('#post-form button[type="submit"]').click();
      const error = list.locator('.field-error').first();
      await error.waitFor({ timeout: 10_000 });
      await expect(error.getAttribute('data-path')).resolves.toBe('stations[1].orifice.outer');
      const line = error.locator('xpath=..');
      await expect(line.getAttribute('data-path')).resolves.toBe('stations[1].orifice.outer');
      await expect(line.locator('code').textContent()).resolves.toMatch(/^\s*"outer": \[$/);
      await expect(list.locator('[role="alert"]').textContent()).resolves.toContain('400');
      await list.screenshot({ path: new URL('review-page-field-error.png', OUT).pathname, fullPage: true });
      await list.close();
    });

    it('a schedule posted from the list page is followed until it is finished, then its plan page opens', async () => {
      const list = await browser.newPage({ viewport: { width: 900, height: 1000 } });
      await list.goto(`${base}/`);
      await list.locator('#schedule-text').fill(JSON.stringify(SMALL_SCHEDULE));
      await list.locator('#post-form button[type="submit"]').click();
      await list.waitForURL(/\/plans\/[0-9a-f-]{36}$/, { timeout: 50_000 });
      await list.locator('#plan-title .badge').waitFor({ timeout: 20_000 });
      await expect(list.locator('#plan-title').textContent()).resolves.toContain(SMALL_SCHEDULE.name);
      await list.close();
    }, 70_000);

    it('with tokens configured the page asks for one, keeps it for the tab and sends it as a Bearer header', async () => {
      const token = 'review-page-test-token-0123';
      const guarded = await buildApp({
        logger: pino({ level: 'silent' }),
        apiTokens: [{ name: 'reviewer', scope: 'write', token }],
      });
      try {
        await guarded.listen({ host: '127.0.0.1', port: 0 });
        const at = `http://127.0.0.1:${(guarded.server.address() as AddressInfo).port}`;
        const tab = await browser.newPage({ viewport: { width: 1024, height: 900 } });
        await tab.goto(`${at}/`);
        await tab.locator('#token-form').waitFor({ state: 'visible', timeout: 10_000 });
        await expect(tab.locator('#list-status').textContent()).resolves.toContain('401');
        await tab.locator('#token-input').fill(token);
        await tab.locator('#token-form button[type="submit"]').click();
        await expect
          .poll(() => tab.locator('#list-status').textContent(), { timeout: 10_000 })
          .toMatch(/No plans yet|shown/);
        await tab.locator('#schedule-text').fill(JSON.stringify(SMALL_SCHEDULE));
        await tab.locator('#post-form button[type="submit"]').click();
        await tab.waitForURL(/\/plans\/[0-9a-f-]{36}$/, { timeout: 50_000 });
        await tab.locator('#plan-title .badge').waitFor({ timeout: 20_000 });
        await expect(tab.locator('#plan-title').textContent()).resolves.toContain(SMALL_SCHEDULE.name);
        await tab.close();
      } finally {
        await guarded.close();
      }
    }, 70_000);
  },
);
