import { createHash } from 'node:crypto';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/errors.js';
import { escapeHtml } from '../../src/report/escapeHtml.js';
import { loadReportAssets, packageRoot } from '../../src/report/loadReportAssets.js';
import { fillTemplate, fillTemplateChunks, renderReport, renderReportChunks } from '../../src/report/renderReport.js';
import { buildReportModel } from '../../src/report/reportModel.js';
import { HOSTILE, syntheticFlight } from './syntheticFlight.js';

const assets = loadReportAssets();
const FIXED = { generatedAt: new Date(Date.UTC(2026, 4, 4, 15, 0, 0)) };
const hostileModel = buildReportModel(syntheticFlight({ durationS: 1200, hz: 10, hostile: true }), FIXED);
const html = renderReport(hostileModel, assets);

/** The text of every <script> element, in page order, with its opening tag. */
function scripts(page: string): { tag: string; text: string }[] {
  return [...page.matchAll(/(<script\b[^>]*>)([\s\S]*?)<\/script>/gi)].map((m) => ({ tag: m[1], text: m[2] }));
}
/** The page with the content of every script element removed: the markup a browser parses as HTML. */
function markupOnly(page: string): string {
  return page.replace(/(<script\b[^>]*>)[\s\S]*?<\/script>/gi, '$1</script>');
}
function cspOf(page: string): Map<string, string[]> {
  const m = /<meta http-equiv="Content-Security-Policy" content="([^"]*)">/.exec(page);
  if (m === null) throw new Error('no CSP meta');
  const text = m[1].replace(/&#39;/g, "'");
  return new Map(text.split(';').map((d) => d.trim().split(/\s+/)).map(([name, ...vals]) => [name, vals]));
}

describe('renderReport: text from the log is shown as text', () => {
  // Source: HTML Living Standard §4.12.1.3 (a script element ends at the first "</script"); OWASP XSS rules #1–#2.
  it('has exactly three script elements (data, chart library, page script): nothing broke out of them', () => {
    expect(html.match(/<script\b/gi)).toHaveLength(3);
    expect(html.match(/<\/script/gi)).toHaveLength(3);
    const s = scripts(html);
    expect(s.map((x) => x.tag)).toEqual(['<script type="application/json" id="report-data">', '<script>', '<script>']);
  });

  it('never writes the hostile strings raw, and writes each one escaped into the page', () => {
    for (const raw of [HOSTILE.name, HOSTILE.aircraft, HOSTILE.pilot, HOSTILE.file, HOSTILE.warning, HOSTILE.comment]) {
      expect(markupOnly(html)).not.toContain(raw);
      expect(html).toContain(escapeHtml(raw));
    }
    expect(html).not.toContain('<img src=x');
    expect(html).not.toContain('<b>bold</b>');
  });

  it('has no event-handler attribute on any tag (the quote in the aircraft name did not open one)', () => {
    const tags = markupOnly(html).match(/<[a-zA-Z][^>]*>/g) ?? [];
    expect(tags.length).toBeGreaterThan(100);
    for (const tag of tags) expect(tag).not.toMatch(/\son[a-z]+\s*=/i);
  });

  it('fills placeholders once: a "{{CSP}}" or "$&" in a log comment stays literal text', () => {
    expect(html).toContain(escapeHtml(HOSTILE.comment)); // holds {{CSP}}, $& and $' unchanged
    expect(markupOnly(html).match(/\{\{[A-Z_]+\}\}/g)).toEqual(['{{CSP}}']); // only the comment's own
  });

  // Oracle: JSON.parse; the data block holds no "<" at all, so it cannot contain "</script".
  it('puts the data in a JSON block that cannot close its script and parses back to the log text', () => {
    const block = scripts(html)[0].text;
    expect(block).not.toContain('<');
    const data = JSON.parse(block);
    expect(data.title).toBe(HOSTILE.name);
    expect(data.series.n).toBe(hostileModel.series.n);
  });
});

describe('renderReport: offline and locked down', () => {
  it('declares a Content-Security-Policy before any script that forbids all network access', () => {
    expect(html.indexOf('http-equiv="Content-Security-Policy"')).toBeLessThan(html.indexOf('<script'));
    const csp = cspOf(html);
    expect(csp.get('default-src')).toEqual(["'none'"]);
    expect(csp.get('connect-src')).toEqual(["'none'"]);
    expect(csp.get('img-src')).toEqual(['data:', 'blob:']); // in-page memory only (Plotly's PNG export)
    expect(csp.get('style-src')).toEqual(["'unsafe-inline'"]);
    expect(csp.get('form-action')).toEqual(["'none'"]);
  });

  // Oracle: CSP Level 3 §2.3.1 hash sources, computed here with node:crypto over each inline script's text.
  it('admits exactly the two inline scripts by their SHA-256, with no unsafe-inline or unsafe-eval', () => {
    const allowed = cspOf(html).get('script-src') ?? [];
    const expected = scripts(html)
      .slice(1)
      .map((s) => `'sha256-${createHash('sha256').update(s.text, 'utf8').digest('base64')}'`);
    expect(allowed).toEqual(expected);
  });

  it('references nothing outside the page: no src/href to another document, no CSS url() or @import', () => {
    const markup = markupOnly(html);
    expect(markup).not.toMatch(/<(link|img|iframe|object|embed|audio|video|source|base)\b/i);
    expect(markup).not.toMatch(/<script\b[^>]*\bsrc=/i);
    for (const m of markup.matchAll(/\s(src|href|xlink:href|action|poster)\s*=\s*"([^"]*)"/gi)) expect(m[2]).toMatch(/^#/);
    const css = /<style>([\s\S]*?)<\/style>/.exec(html)?.[1] ?? '';
    expect(css).not.toMatch(/@import/i);
    for (const m of css.matchAll(/url\(([^)]*)\)/g)) expect(m[1]).toMatch(/^#/);
  });

  it('holds no http(s) URL anywhere but inside the chart library’s own code', () => {
    const s = scripts(html);
    const outsidePlotly = html.replace(s[1].text, '');
    expect(outsidePlotly).not.toMatch(/https?:\/\//i);
  });

  it('tells Plotly not to fetch anything and hides its logo (no MathJax, no topojson, no cloud)', () => {
    const page = scripts(html)[2].text;
    for (const key of ['displaylogo: false', 'typesetMath: false', 'showSendToCloud: false', "topojsonURL: 'data:,'"]) expect(page).toContain(key);
  });
});

describe('renderReport: content and order', () => {
  it('has the seven sections in debrief order', () => {
    const ids = ['s-glance', 's-plan', 's-timeline', 's-card', 's-events', 's-health', 's-notes'];
    const at = ids.map((id) => html.indexOf(`<section id="${id}">`));
    expect(at.every((p) => p > 0)).toBe(true);
    expect([...at].sort((x, y) => x - y)).toEqual(at);
  });

  it('states the cautions and explains the trade terms used', () => {
    expect(html).toContain('It is not for navigation or airworthiness decisions');
    expect(html).toContain('licensed maintenance practice govern');
    for (const term of ['Variation', 'Deviation', 'Dip', 'Lubber line', 'Turning error', 'Acceleration error', 'Swirl', 'Standard-rate turn']) {
      expect(html).toContain(`<dt>${term}</dt>`);
    }
  });

  it('links every table row to its moment with finite UTC times', () => {
    const rows = [...html.matchAll(/<tr class="jump" tabindex="0" data-t="([^"]*)" data-t0="([^"]*)" data-t1="([^"]*)"/g)];
    const m = hostileModel;
    expect(rows).toHaveLength(m.turns.length + m.episodes.length + m.divergences.length + m.excursions.length + m.glance.biggestErrors.length);
    for (const r of rows) for (const v of [r[1], r[2], r[3]]) expect(Number.isFinite(Number(v)) && v !== '').toBe(true);
  });

  it('shows a clear sentence instead of an empty table when an analysis found nothing', () => {
    const bare = renderReport(buildReportModel(syntheticFlight({ durationS: 300, hz: 5, withEvents: false }), FIXED), assets);
    for (const text of ['No turns to list', 'No speed-change episodes to list', 'No divergence windows to list', 'No legs flown on the compass to list']) {
      expect(bare).toContain(text);
    }
    expect(bare).not.toContain('id="turns-table"');
  });

  it('lists at most 200 warnings on the page and says how many more the summary JSON holds', () => {
    const a = syntheticFlight({ durationS: 60, hz: 5 });
    a.warnings = Array.from({ length: 250 }, (_, k) => ({ code: 'odd-record', message: `record ${k} looked odd` }));
    const page = renderReport(buildReportModel(a, FIXED), assets);
    expect(page.match(/<code>odd-record<\/code>/g)).toHaveLength(200);
    expect(page).toContain('and 50 more warnings, listed in the summary JSON.');
  });

  it('renders a flight of a single sample without throwing', () => {
    const one = syntheticFlight({ durationS: 0.2, hz: 5 });
    expect(one.state.n).toBe(1);
    const page = renderReport(buildReportModel(one, FIXED), assets);
    expect(page).toContain('Every sample is drawn (1).');
  });

  it('is a pure function: the same model and assets give the same page', () => {
    expect(renderReport(hostileModel, assets)).toBe(html);
  });

  it('gives, as chunks for writing out, the very bytes of the page as UTF-8 (chart library as bytes)', () => {
    const chunks = renderReportChunks(hostileModel, assets);
    expect(chunks.some((c) => c instanceof Uint8Array)).toBe(true);
    const written = Buffer.concat(chunks.map((c) => (typeof c === 'string' ? Buffer.from(c, 'utf8') : c)));
    expect(written.equals(Buffer.from(html, 'utf8'))).toBe(true);
    // A second page of the process reuses the encoded library (the same bytes object).
    const again = renderReportChunks(hostileModel, assets);
    expect(again.find((c) => c instanceof Uint8Array)).toBe(chunks.find((c) => c instanceof Uint8Array));
  });

  it('keeps a 3-hour 10 Hz flight (108,000 samples) under 6 MB, chart library included', () => {
    const big = renderReport(buildReportModel(syntheticFlight({ durationS: 10_800, hz: 10 }), FIXED), assets);
    expect(Buffer.byteLength(big, 'utf8')).toBeLessThan(6_000_000);
  });
});

describe('fillTemplate and loadReportAssets', () => {
  it('throws an InputError for a placeholder without a value and for a value without a placeholder', () => {
    expect(() => fillTemplate('<p>{{A}}{{B}}</p>', { A: 'x' })).toThrow(InputError);
    expect(() => fillTemplate('<p>{{A}}</p>', { A: 'x', B: 'y' })).toThrow(/\{\{B\}\}/);
    expect(fillTemplate('{{A}}-{{A}}', { A: '$&{{A}}' })).toBe('$&{{A}}-$&{{A}}');
  });

  it('keeps text runs joined and byte values apart, in template order', () => {
    const b = new Uint8Array([0x41]);
    expect(fillTemplateChunks('<{{A}}|{{B}}|{{A}}>', { A: 'x', B: b })).toEqual(['<x|', b, '|x>']);
    expect(fillTemplateChunks('{{B}}', { B: b })).toEqual(['', b, '']);
  });

  it('finds the template beside package.json and the chart library through module resolution', () => {
    expect(packageRoot()).toBe(join(import.meta.dirname, '..', '..'));
    expect(assets.html).toContain('{{DATA_JSON}}');
    expect(assets.plotlyJs.slice(0, 200)).toMatch(/plotly\.js v\d/);
  });

  it('names the missing file when the template folder is wrong', () => {
    expect(() => loadReportAssets('/nonexistent/report-template')).toThrow(/report\.html/);
  });
});

describe('renderReport: the CSP hashes', () => {
  it('are the same with the native SHA-256 of the assets and with the pure-TypeScript one (FIPS 180-4 both)', () => {
    const { sha256Base64: _native, ...pureAssets } = assets;
    expect(assets.sha256Base64).toBeTypeOf('function');
    expect(renderReport(hostileModel, pureAssets)).toBe(html);
  });
});
