// The debrief page in real headless Chromium (Debian's `chromium`), opened from a file:// URL.
import { mkdirSync, statSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadReportAssets } from '../../src/report/loadReportAssets.js';
import { renderReport } from '../../src/report/renderReport.js';
import { buildReportModel } from '../../src/report/reportModel.js';
import { HOSTILE, syntheticFlight } from '../report/syntheticFlight.js';
import { CHROMIUM_PATH, chromiumAvailable, launchFreshContext } from './launchChromium.js';
import { measureReportInBrowser } from './measureReport.js';

const OUT = resolve(import.meta.dirname, '..', '..', 'test-output');
const available = chromiumAvailable();
if (!available) {
  console.warn(`browser suite skipped: ${CHROMIUM_PATH} is missing (install Debian's package: apt-get install -y chromium)`);
}

interface Seen {
  requests: string[];
  routed: string[];
  consoleErrors: string[];
  pageErrors: string[];
  dialogs: string[];
}

describe.skipIf(!available)('the debrief page in headless Chromium', () => {
  let context: BrowserContext;
  let close: () => Promise<void>;
  let page: Page;
  let fileUrl: string;
  const seen: Seen = { requests: [], routed: [], consoleErrors: [], pageErrors: [], dialogs: [] };
  const model = buildReportModel(syntheticFlight({ durationS: 2400, hz: 10, hostile: true }), { generatedAt: new Date(Date.UTC(2026, 4, 4, 15)) });

  beforeAll(async () => {
    mkdirSync(OUT, { recursive: true });
    const htmlPath = join(OUT, 'report-browser-test.html');
    writeFileSync(htmlPath, renderReport(model, loadReportAssets()));
    fileUrl = pathToFileURL(htmlPath).href;
    ({ context, close } = await launchFreshContext());
    await context.route('**', (route) => {
      seen.routed.push(route.request().url());
      return route.request().url() === fileUrl ? route.continue() : route.abort();
    });
    page = await context.newPage();
    page.on('request', (r) => seen.requests.push(r.url()));
    page.on('console', (m) => {
      if (m.type() === 'error') seen.consoleErrors.push(m.text());
    });
    page.on('pageerror', (e) => seen.pageErrors.push(e.message));
    page.on('dialog', (d) => {
      seen.dialogs.push(d.message());
      void d.dismiss();
    });
    // Recorded outside the page's CSP (an init script), so a violation cannot hide itself.
    await page.addInitScript(() => {
      const w = window as unknown as { __cspViolations: string[] };
      w.__cspViolations = [];
      document.addEventListener('securitypolicyviolation', (e) => w.__cspViolations.push(`${e.violatedDirective} ${e.blockedURI}`));
    });
    await page.goto(fileUrl, { waitUntil: 'load' });
    await page.waitForFunction(() => typeof (window as unknown as { __reportReady?: number }).__reportReady === 'number', undefined, { timeout: 60_000 });
  });

  afterAll(async () => {
    await close?.();
  });

  it('opens from a file:// URL and reports every chart drawn', async () => {
    expect(page.url()).toBe(fileUrl);
    expect(await page.getAttribute('body', 'data-ready')).toBe('1');
  });

  it('sends no request but the page itself (request log and a catch-all route)', async () => {
    await page.waitForTimeout(300); // let any late request show up
    expect(seen.requests).toEqual([fileUrl]);
    expect(seen.routed.filter((u) => u !== fileUrl)).toEqual([]);
  });

  it('logs no console error, throws no page error and violates no CSP directive', async () => {
    expect(seen.consoleErrors).toEqual([]);
    expect(seen.pageErrors).toEqual([]);
    expect(await page.evaluate(() => (window as unknown as { __cspViolations: string[] }).__cspViolations)).toEqual([]);
  });

  it('draws the plan view and the timeline with all their traces', async () => {
    const counts = await page.evaluate(() => {
      const plot = (id: string) => document.getElementById(id) as unknown as { data?: unknown[] } & HTMLElement;
      return ['plan-plot', 'timeline-plot'].map((id) => ({
        svg: plot(id).querySelectorAll('.main-svg').length,
        drawnTraces: plot(id).querySelectorAll('.scatterlayer .trace').length,
        dataTraces: plot(id).data?.length ?? 0,
      }));
    });
    const [plan, timeline] = counts;
    expect(plan.svg).toBeGreaterThan(0);
    expect(plan.drawnTraces).toBeGreaterThanOrEqual(11); // 11 error bands at least
    expect(timeline.svg).toBeGreaterThan(0);
    expect(timeline.dataTraces).toBe(9); // compass band, track, 2 headings, 2 compass readings, error, bank, accel
    expect(timeline.drawnTraces).toBe(9);
    // Every timeline trace drew a line of many segments (Plotly's path "d" holds one "L" per vertex kept).
    const segments = await page.evaluate(() =>
      [...document.querySelectorAll('#timeline-plot .scatterlayer .trace')].map((tr) =>
        [...tr.querySelectorAll('path.js-line, path.js-fill')].reduce((n, p) => n + ((p.getAttribute('d') ?? '').match(/L/g) ?? []).length, 0),
      ),
    );
    expect(segments).toHaveLength(9);
    for (const count of segments) expect(count).toBeGreaterThan(10); // Plotly merges collinear runs, so flat lines keep few
  });

  it('moves the drawn card when the slider moves, and reads out the value of that moment', async () => {
    const before = await page.evaluate(() => ({
      strip: document.getElementById('card-strip')!.innerHTML,
      reading: document.getElementById('card-strip')!.getAttribute('data-reading'),
      readout: document.getElementById('ro-compass')!.textContent,
    }));
    // The drawn point of the largest error: its reading surely differs from the first point's.
    const k = model.series.errorDeg.reduce<number>((best, e, i, all) => (Math.abs(e ?? 0) > Math.abs(all[best] ?? 0) ? i : best), 0);
    const expected = model.series.compassDeg[k] as number;
    await page.locator('#moment-slider').fill(String(k));
    await page.waitForFunction((v) => document.getElementById('card-strip')!.getAttribute('data-reading') === v, expected.toFixed(1));
    const after = await page.evaluate(() => ({
      strip: document.getElementById('card-strip')!.innerHTML,
      readout: document.getElementById('ro-compass')!.textContent,
      lubberX: Number(document.getElementById('lubber-line')!.getAttribute('x1')),
      numerals: [...document.querySelectorAll('#card-strip text')].map((t) => t.textContent),
    }));
    expect(before.reading).not.toBe(expected.toFixed(1));
    expect(after.strip).not.toBe(before.strip);
    expect(after.readout).toBe(`${String(((Math.round(expected) % 360) + 360) % 360).padStart(3, '0')}°`);
    expect(after.readout).not.toBe(before.readout);
    expect(after.numerals.length).toBeGreaterThanOrEqual(3); // numerals every 30° across a ±70° window
  });

  // Classic float card seen from behind (common practice; derived: the graduation facing the pilot is the
  // heading, so the larger numbers lie to the pilot's left).
  it('draws the card with larger numbers to the left of the lubber line', async () => {
    const k = model.series.compassDeg.findIndex((c) => c !== null && c > 100 && c < 110);
    await page.locator('#moment-slider').fill(String(k));
    await page.waitForFunction((v) => document.getElementById('card-strip')!.getAttribute('data-reading') === v, (model.series.compassDeg[k] as number).toFixed(1));
    const xOf = await page.evaluate(() => {
      const out: Record<string, number> = {};
      for (const t of document.querySelectorAll('#card-strip text')) {
        const m = /translate\(([-\d.]+)/.exec(t.getAttribute('transform') ?? '');
        if (m) out[t.textContent ?? ''] = Number(m[1]);
      }
      return out;
    });
    expect(xOf.E).toBeGreaterThan(280); // 090 is below the reading of 10x: right of the lubber line (x = 280)
    expect(xOf['12']).toBeLessThan(280); // 120 is above it: left
  });

  it('jumps to a divergence window’s peak when its table row is clicked', async () => {
    const d = model.divergences[0];
    const sliderBefore = await page.locator('#moment-slider').inputValue();
    await page.locator('#divergences-table tbody tr').first().click();
    await page.waitForFunction((v) => (document.getElementById('moment-slider') as HTMLInputElement).value !== v, sliderBefore);
    await page.waitForTimeout(500); // a hover after the scroll would move it again: it must not
    const slider = Number(await page.locator('#moment-slider').inputValue());
    expect(await page.locator('#ro-time').textContent()).toBe(new Date(Math.round(d.peakUtc) * 1000).toISOString().slice(11, 19) + 'Z');
    const tS = model.series.tS[slider] as number;
    expect(Math.abs(model.series.t0Utc + tS - d.peakUtc)).toBeLessThan(1);
    const range = await page.evaluate(() => (document.getElementById('timeline-plot') as unknown as { layout: { xaxis: { range: unknown[] } } }).layout.xaxis.range);
    expect(range).toHaveLength(2); // the timeline zoomed to the window
  });

  it('moves the card when the pointer hovers over the timeline', async () => {
    const before = await page.locator('#ro-time').textContent();
    await page.locator('#zoom-all').click();
    const box = await page.locator('#timeline-plot .nsewdrag').first().boundingBox();
    expect(box).not.toBeNull();
    await page.mouse.move(box!.x + box!.width * 0.7, box!.y + box!.height * 0.5, { steps: 5 });
    await page.waitForFunction((t) => document.getElementById('ro-time')!.textContent !== t, before);
    expect(await page.locator('#ro-time').textContent()).not.toBe(before);
  });

  it('shows the hostile log text as text: title, aircraft, pilot, comment and warning, and runs none of it', async () => {
    expect(await page.locator('#report-title').textContent()).toBe(HOSTILE.name);
    const body = (await page.locator('body').textContent()) ?? '';
    for (const s of [HOSTILE.aircraft, HOSTILE.pilot, HOSTILE.comment, HOSTILE.warning, HOSTILE.file]) expect(body).toContain(s);
    expect(await page.title()).toBe(`${HOSTILE.name} · compass debrief`);
    expect(await page.locator('img').count()).toBe(0);
    expect(await page.locator('[onmouseover], [onerror]').count()).toBe(0);
    expect(seen.dialogs).toEqual([]);
  });

  it('writes a screenshot of the page and of the card under test-output/', async () => {
    await page.locator('#zoom-all').click();
    const full = join(OUT, 'report-browser.png');
    await page.screenshot({ path: full, fullPage: true });
    await page.locator('#s-card').screenshot({ path: join(OUT, 'report-browser-card.png') });
    expect(statSync(full).size).toBeGreaterThan(50_000);
  });

  it('prints on A4 and on US Letter without errors', async () => {
    for (const format of ['A4', 'Letter'] as const) {
      const pdf = await page.pdf({ format, printBackground: true, path: join(OUT, `report-browser-${format}.pdf`) });
      expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
      const pages = (pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g) ?? []).length;
      expect(pages).toBeGreaterThan(3);
    }
    expect(seen.pageErrors).toEqual([]);
  });
});

describe.skipIf(!available)('Plotly’s own PNG export under the page’s CSP', () => {
  it('downloads a chart as PNG through in-page blob:/data: URLs only, with no CSP violation', async () => {
    const { context, close } = await launchFreshContext();
    try {
      const page = await context.newPage();
      const requests: string[] = [];
      const errors: string[] = [];
      page.on('request', (r) => requests.push(r.url()));
      page.on('console', (m) => {
        if (m.type() === 'error') errors.push(m.text());
      });
      page.on('pageerror', (e) => errors.push(e.message));
      mkdirSync(OUT, { recursive: true });
      const htmlPath = join(OUT, 'report-browser-export.html');
      writeFileSync(htmlPath, renderReport(buildReportModel(syntheticFlight({ durationS: 600, hz: 5 }), {}), loadReportAssets()));
      await page.goto(pathToFileURL(htmlPath).href);
      await page.waitForFunction(() => typeof (window as unknown as { __reportReady?: number }).__reportReady === 'number', undefined, { timeout: 60_000 });
      await page.locator('#plan-plot').hover();
      const download = page.waitForEvent('download', { timeout: 20_000 });
      await page.locator('#plan-plot .modebar-btn[data-title^="Download"]').click();
      expect((await download).suggestedFilename()).toMatch(/\.png$/);
      expect(errors).toEqual([]);
      for (const u of requests) expect(u).toMatch(/^(file:|blob:|data:)/);
    } finally {
      await close();
    }
  });
});

describe.skipIf(!available)('measureReportInBrowser', () => {
  it('returns the time until every chart is drawn for a 108,000-sample page (logged, not asserted against a limit)', async () => {
    mkdirSync(OUT, { recursive: true });
    const path = join(OUT, 'report-108k.html');
    const html = renderReport(buildReportModel(syntheticFlight({ durationS: 10_800, hz: 10 }), {}), loadReportAssets());
    writeFileSync(path, html);
    const { drawnMs } = await measureReportInBrowser(path);
    console.log(`108,000-sample report: ${(Buffer.byteLength(html) / 1e6).toFixed(2)} MB, every chart drawn ${drawnMs.toFixed(0)} ms after navigation`);
    expect(Number.isFinite(drawnMs)).toBe(true);
    expect(drawnMs).toBeGreaterThan(0);
  });
});
