/**
 * The preview page in a real browser: Debian's chromium (no GPU), driven by playwright-core,
 * against the service listening on a loopback port. It loads the page, changes a parameter and
 * the seed and sees the drawing and the metrics follow, asks for an infeasible and a malformed
 * track and sees the service's explanation, downloads the glb, reopens a shared link, and takes
 * a screenshot of the page at 1280 x 800: examples/preview.png (shown in the README),
 * written when it is missing or with UPDATE_SCREENSHOT=1 (it shows this run's loopback port, so
 * rewriting it on every run would only churn the file).
 *
 * Needs /usr/bin/chromium (or LAPWRIGHT_CHROMIUM): `apt-get install -y chromium`. Without it the
 * test is skipped with that message, except in CI (CI set), where .ci/run installs it and a
 * missing browser fails the test. No timing is asserted; waits are bounded.
 */
import { existsSync } from 'node:fs';
import { readFile, writeFile } from 'node:fs/promises';
import type { FastifyInstance } from 'fastify';
import { type Browser, chromium, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateTrack, InfeasibleError, type TrackRequest } from '../../src/core/index.js';
import { describeParams } from '../../src/server/params-doc.js';
import { findPreset } from '../../src/server/presets.js';
import { readyApp } from '../server/helpers.js';

const CHROMIUM = process.env.LAPWRIGHT_CHROMIUM ?? '/usr/bin/chromium';
const CHROMIUM_ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking'];
const HAS_CHROMIUM = existsSync(CHROMIUM);
const IN_CI = process.env.CI !== undefined && process.env.CI !== '' && process.env.CI !== 'false';
const RUN = HAS_CHROMIUM || IN_CI;
const SKIP_REASON = `skipped: no chromium at ${CHROMIUM} (install it with apt-get install -y chromium, or set LAPWRIGHT_CHROMIUM)`;
/** Where the screenshot goes (committed, shown in the README); UPDATE_SCREENSHOT=1 rewrites it. */
const SCREENSHOT = new URL('../../examples/preview.png', import.meta.url);
const UPDATE_SCREENSHOT = process.env.UPDATE_SCREENSHOT === '1';
/** Longest wait for one thing the page does (a track is generated in well under a second). */
const WAIT_MS = 15_000;
const VIEWPORT = { width: 1280, height: 800 } as const;

if (!RUN) console.warn(`tests/e2e/preview.test.ts ${SKIP_REASON}`);

let app: FastifyInstance;
let base: string;
let browser: Browser;
let page: Page;

// the page has answered the last change (aria-busy false) with a track other than `previous`
async function nextTrack(previous: string | undefined, on: Page = page): Promise<string> {
  await on.waitForFunction(
    (prev) => {
      const figure = document.getElementById('preview')!;
      return figure.getAttribute('aria-busy') === 'false' && figure.dataset.state === 'ready' && figure.dataset.trackId !== prev;
    },
    previous ?? null,
    { timeout: WAIT_MS },
  );
  return (await on.getAttribute('#preview', 'data-track-id'))!;
}

// the page has answered the last change; its figure's state (ready or problem)
async function settled(): Promise<string> {
  await page.waitForFunction(() => document.getElementById('preview')!.getAttribute('aria-busy') === 'false', null, { timeout: WAIT_MS });
  return (await page.getAttribute('#preview', 'data-state'))!;
}

async function shownTrackId(): Promise<string | undefined> {
  return (await page.getAttribute('#preview', 'data-track-id')) ?? undefined;
}

// the SVG the page shows, read back from the image's blob
async function shownSvg(): Promise<string> {
  return page.evaluate(async () => (await fetch((document.getElementById('preview-image') as HTMLImageElement).src)).text());
}

function metricNumber(text: string | null): number {
  return Number((text ?? '').replace(/,/g, '').match(/-?\d+(\.\d+)?/)?.[0]);
}

function infeasible(request: TrackRequest): InfeasibleError {
  try {
    generateTrack(request);
  } catch (err) {
    if (err instanceof InfeasibleError) return err;
    throw err;
  }
  throw new Error(`expected ${JSON.stringify(request)} to be infeasible`);
}

describe.skipIf(!RUN)(RUN ? 'preview page in chromium' : `preview page in chromium (${SKIP_REASON})`, () => {
  beforeAll(async () => {
    app = await readyApp({ workers: 2 });
    base = await app.listen({ port: 0, host: '127.0.0.1' });
    browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS, timeout: 30_000 });
    page = await browser.newPage({ viewport: VIEWPORT, acceptDownloads: true });
    page.setDefaultTimeout(WAIT_MS);
  }, 60_000);

  afterAll(async () => {
    await browser?.close();
    await app?.close();
  });

  it('builds the form from GET /v1/params and draws the track of the seed in the address bar', async () => {
    await page.goto(`${base}/?seed=larkspur-preview&lengthM=1800`);
    const id = await nextTrack(undefined);
    const track = generateTrack({ seed: 'larkspur-preview', lengthM: 1800 });
    expect(id).toBe(track.id);
    // every parameter has a labelled field with the service's range or choices
    for (const p of describeParams().parameters) {
      // the accessible name is the short label and the API name: "Lap length lengthM"
      const name = new RegExp(`(^| )${p.name.replace(/\./g, '\\.')}$`);
      if (p.type === 'number' || p.type === 'integer') {
        const input = page.getByRole('spinbutton', { name });
        expect([p.name, await input.getAttribute('min'), await input.getAttribute('max')]).toEqual([p.name, String(p.min), String(p.max)]);
      } else if (p.type === 'choice') {
        const options = await page.getByRole('combobox', { name }).locator('option').evaluateAll((os) => os.map((o) => (o as HTMLOptionElement).value));
        expect([p.name, options]).toEqual([p.name, ['', ...p.values!]]);
      } else {
        expect(await page.getByRole('textbox', { name }).count()).toBe(1);
      }
    }
    expect(await page.inputValue('#param-lengthM')).toBe('1800');
    expect(await page.inputValue('#seed')).toBe('larkspur-preview');
    expect(await page.textContent('#param-lengthM-range')).toBe('300–20000 m · default 1500 m');
    // the drawing is the service's SVG of this track; metrics and corners are the track's
    expect(await shownSvg()).toContain(`data-track-id="${track.id}"`);
    expect(metricNumber(await page.textContent('#metric-lengthM'))).toBeCloseTo(track.metrics.lengthM, 0);
    expect(metricNumber(await page.textContent('#metric-cornerCount'))).toBe(track.metrics.cornerCount);
    expect(await page.locator('#corners tbody tr').count()).toBe(track.corners.length);
  });

  it('changing a parameter and then the seed redraws the track, and the metrics and the link follow', async () => {
    const before = await shownTrackId();
    const svgBefore = await shownSvg();
    await page.fill('#param-lengthM', '2600');
    const longer = await nextTrack(before);
    const track = generateTrack({ seed: 'larkspur-preview', lengthM: 2600 });
    expect(longer).toBe(track.id);
    expect(await shownSvg()).not.toBe(svgBefore);
    expect(metricNumber(await page.textContent('#metric-lengthM'))).toBeCloseTo(track.metrics.lengthM, 0);
    expect(new URL(page.url()).searchParams.get('lengthM')).toBe('2600');

    await page.click('#new-seed');
    const reseeded = await nextTrack(longer);
    const seed = await page.inputValue('#seed');
    expect(seed).not.toBe('larkspur-preview');
    expect(reseeded).toBe(generateTrack({ seed: Number(seed), lengthM: 2600 }).id);
    expect(new URL(page.url()).searchParams.get('seed')).toBe(seed);
    expect(await page.textContent('#status')).toContain(reseeded.slice(0, 8));
  });

  it('an infeasible request shows the service\'s reason and hint instead of a picture', async () => {
    const seed = await page.inputValue('#seed');
    await page.fill('#param-turnBalance', '0');
    await page.fill('#param-curvatureBudgetDeg', '900');
    const err = infeasible({ seed: Number(seed), lengthM: 2600, turnBalance: 0, curvatureBudgetDeg: 900 });
    expect(await settled()).toBe('problem');
    expect(await page.textContent('#problem-title')).toBe('No track meets these values');
    expect(await page.textContent('#problem-message')).toBe(err.message);
    expect(await page.textContent('#problem-hint')).toBe(`What to change: ${err.hint}`);
    expect(await page.textContent('#problem-code')).toBe('ERR_INFEASIBLE · turning_vs_balance');
    expect(await page.isVisible('#preview-image')).toBe(false);
    expect(await page.getAttribute('#download-glb', 'aria-disabled')).toBe('true');
    expect(await page.getAttribute('#download-glb', 'href')).toBeNull();
  });

  it('a malformed value is named next to its field, in the service\'s words', async () => {
    await page.fill('#param-turnBalance', '');
    await page.fill('#param-curvatureBudgetDeg', '');
    await page.fill('#param-lengthM', '50');
    expect(await settled()).toBe('problem');
    expect(await page.textContent('#problem-title')).toBe('Some values are not accepted');
    expect(await page.textContent('#param-lengthM-error')).toBe('expected a number from 300 to 20000 m, got 50');
    expect(await page.getAttribute('#param-lengthM', 'aria-invalid')).toBe('true');
    expect(await page.textContent('#problem-issues')).toBe('lengthM: expected a number from 300 to 20000 m, got 50');
  });

  it('downloads the glb of the track shown', async () => {
    await page.fill('#param-lengthM', '2600');
    const id = await nextTrack(undefined);
    expect(await page.getAttribute('#param-lengthM', 'aria-invalid')).toBeNull();
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('#download-glb')]);
    expect(download.suggestedFilename()).toBe(`track-${id.slice(0, 8)}.glb`);
    const bytes = await readFile((await download.path())!);
    expect(bytes.subarray(0, 4).toString('latin1')).toBe('glTF');
    expect(bytes.readUInt32LE(8)).toBe(bytes.length);
    for (const [link, format] of [['#download-json', 'json'], ['#download-svg', 'svg'], ['#download-csv', 'csv'], ['#download-csv-gates', 'csv']] as const) {
      expect(new URL((await page.getAttribute(link, 'href'))!, base).searchParams.get('format')).toBe(format);
    }
  });

  it('the shared link restores the request in a new page; the screenshot is saved', async () => {
    await page.fill('#seed', 'larkspur-heldout-0042');
    await page.selectOption('#preset', 'technical');
    await page.check('#heat');
    const id = await nextTrack(undefined);
    expect(id).toBe(generateTrack({ seed: 'larkspur-heldout-0042', ...findPreset('technical')!.params }).id);
    expect(await shownSvg()).toContain('data-heat-limit=');
    const shared = await page.inputValue('#share-url');
    expect(shared).toBe(page.url());
    expect(new URL(shared).searchParams.get('cornerCount')).toBe('15');

    const other = await browser.newPage({ viewport: VIEWPORT });
    try {
      await other.goto(shared);
      expect(await nextTrack(undefined, other)).toBe(id);
      expect(await other.inputValue('#seed')).toBe('larkspur-heldout-0042');
      expect(await other.inputValue('#param-cornerCount')).toBe('15');
      expect(await other.isChecked('#heat')).toBe(true);
    } finally {
      await other.close();
    }
    // the request's first fields in view, nothing focused
    await page.evaluate(() => {
      (document.activeElement as HTMLElement | null)?.blur();
      document.getElementById('request-form')!.scrollTop = 0;
    });
    const png = await page.screenshot();
    expect(png.subarray(1, 4).toString('latin1')).toBe('PNG');
    expect([png.readUInt32BE(16), png.readUInt32BE(20)]).toEqual([VIEWPORT.width, VIEWPORT.height]);
    // the picture holds this run's port, so it is written only when missing or asked for
    if (UPDATE_SCREENSHOT || !existsSync(SCREENSHOT)) await writeFile(SCREENSHOT, png);
  });
});
