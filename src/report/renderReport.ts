// renderReport: ReportModel + template assets → one self-contained, offline HTML page (a string, or as chunks
// with the chart library as ready-encoded bytes for writing out).
import { InputError } from '../errors.js';
import { escapeHtml, inlineScriptSource, jsonForScriptBlock } from './escapeHtml.js';
import { fmtCount, fmtDuration, fmtUtcDateTime } from './pilotFormat.js';
import type { ReportModel } from './reportModelTypes.js';
import { cspScriptHash } from './sha256.js';
import { eventTablesSection } from './sections/eventTablesSection.js';
import { glanceSection } from './sections/glanceSection.js';
import { logHealthSection } from './sections/logHealthSection.js';
import { CAUTION_TEXT, methodNotesSection } from './sections/methodNotesSection.js';

/** The template files and the chart library, as text. loadReportAssets reads them from disk. */
export interface ReportAssets {
  /** report-template/report.html with {{NAME}} placeholders. */
  html: string;
  /** report-template/report.css */
  css: string;
  /** report-template/report.js (runs in the page) */
  js: string;
  /** plotly.js-dist-min's plotly.min.js */
  plotlyJs: string;
  /**
   * Optional: a SHA-256 (base64) of text, e.g. node:crypto's, used instead of the pure-TypeScript one for the
   * CSP hashes of the inline scripts. Same result; the native one is about 20× faster on the 4.6 MB chart library.
   */
  sha256Base64?: (text: string) => string;
}

/** The part of the model the page script needs (the rest is already in the HTML). */
export interface ReportPageData {
  title: string;
  imageName: string;
  /** The drawn columns without `row` (the page does not need the full-resolution row numbers). */
  series: Omit<ReportModel['series'], 'row'>;
  errorScaleDeg: number;
  /** showLabel: one of the 12 largest peaks (the rest are ringed without text, to keep the charts legible). */
  divergences: { label: string; startUtc: number; endUtc: number; peakUtc: number; showLabel: boolean }[];
  /** Turns and speed changes, labelled on the bank and acceleration panels so the tables can be matched up. */
  turns: { label: string; startUtc: number; endUtc: number }[];
  episodes: { label: string; startUtc: number; endUtc: number }[];
  excursions: { label: string; believedEastNm: (number | null)[]; believedNorthNm: (number | null)[] }[];
  unreliableSpans: ReportModel['unreliableSpans'];
}

/** CSP hash source of an inline script, with the assets' own SHA-256 where they carry one. */
function scriptHash(text: string, assets: ReportAssets): string {
  return assets.sha256Base64 ? `'sha256-${assets.sha256Base64(text)}'` : cspScriptHash(text);
}

/** The chart library as inlined (compile hint + inlineScriptSource) and its CSP hash, for one source text and hash function. */
interface InlinedPlotly {
  source: string;
  sha256Base64: ReportAssets['sha256Base64'];
  text: string;
  hash: string;
  /** `text` as UTF-8, encoded on first use. */
  bytes?: Uint8Array;
}

/** The last chart library inlined: the same 4.6 MB text comes with every flight of a process. */
let lastPlotly: InlinedPlotly | undefined;

/**
 * The chart library's inline script text and CSP hash; made again only when the library's text or the
 * hash function differs from the last call's (a cache of one entry, so the result is as without it).
 */
function inlinedPlotly(assets: ReportAssets): InlinedPlotly {
  const last = lastPlotly;
  if (last !== undefined && last.sha256Base64 === assets.sha256Base64 && last.source === assets.plotlyJs) return last;
  // V8's explicit compile hint (a magic comment, ignored elsewhere): the chart library runs most of its
  // functions while it loads, so compiling them eagerly saves a lazy pre-parse (about 0.15–0.2 s in
  // chromium on the 3-hour flight's page).
  const text = '//# allFunctionsCalledOnLoad\n' + inlineScriptSource(assets.plotlyJs);
  lastPlotly = { source: assets.plotlyJs, sha256Base64: assets.sha256Base64, text, hash: scriptHash(text, assets) };
  return lastPlotly;
}

/**
 * Content-Security-Policy of the page: nothing may be fetched or sent (default-src 'none',
 * connect-src 'none'), scripts run only when their text hashes to one of `scriptHashes` (CSP Level 3
 * hash sources), styles inline, images only from data: and blob: URLs (in-page memory, used by
 * Plotly's "download plot as PNG", never the network).
 */
export function reportCsp(scriptHashes: string[]): string {
  return [
    "default-src 'none'",
    `script-src ${scriptHashes.join(' ')}`,
    "style-src 'unsafe-inline'",
    'img-src data: blob:',
    "font-src 'none'",
    "connect-src 'none'",
    "media-src 'none'",
    "object-src 'none'",
    "frame-src 'none'",
    "worker-src 'none'",
    "base-uri 'none'",
    "form-action 'none'",
  ].join('; ');
}

/** A page as it is written out: text, and ready-encoded UTF-8 bytes for the long constant parts. */
export type PageChunk = string | Uint8Array;

/**
 * Replaces each {{NAME}} of the template with values[NAME] in a single pass, so text inserted for one
 * placeholder is never scanned again (a log name holding "{{CSP}}" stays text). Text runs are joined into
 * one string between byte values.
 * @throws InputError when the template holds a placeholder without a value or lacks one of the values
 */
export function fillTemplateChunks(template: string, values: Record<string, PageChunk>): PageChunk[] {
  const used = new Set<string>();
  const chunks: PageChunk[] = [];
  // Pieces joined by +, not String.prototype.replace: the engine links the megabyte-long values instead of
  // copying them into a new string here (the copy happens once, when the page is written out).
  const placeholder = /\{\{([A-Z_]+)\}\}/g;
  let out = '';
  let from = 0;
  for (let m = placeholder.exec(template); m !== null; m = placeholder.exec(template)) {
    const name = m[1];
    const v = values[name];
    if (v === undefined) throw new InputError('report-template/report.html', `placeholder {{${name}}} has no value`);
    used.add(name);
    out += template.slice(from, m.index);
    if (typeof v === 'string') out += v;
    else {
      chunks.push(out, v);
      out = '';
    }
    from = m.index + m[0].length;
  }
  out += template.slice(from);
  chunks.push(out);
  for (const name of Object.keys(values)) {
    if (!used.has(name)) throw new InputError('report-template/report.html', `placeholder {{${name}}} is missing from the template`);
  }
  return chunks;
}

/** {@link fillTemplateChunks} with text values only: the page as one string. */
export function fillTemplate(template: string, values: Record<string, string>): string {
  return (fillTemplateChunks(template, values) as string[]).join('');
}

/**
 * Renders the debrief page. Pure: the same model and assets give the same string.
 *
 * Everything is inline (CSS, Plotly, the page script, the data as JSON in a
 * `<script type="application/json">` block with `<` written \u003c); a CSP meta forbids any network
 * access and admits only the two inline scripts by their SHA-256. All text from the log or the options
 * is HTML-escaped.
 *
 * @param model from buildReportModel
 * @param assets from loadReportAssets (or test doubles)
 * @returns the complete HTML document (UTF-8 text)
 * @throws InputError when the template and the renderer disagree on placeholders
 */
export function renderReport(model: ReportModel, assets: ReportAssets): string {
  const plotly = inlinedPlotly(assets);
  return fillTemplate(assets.html, pageValues(model, assets, plotly.hash, plotly.text));
}

/**
 * The page of {@link renderReport} as chunks for writing out, the same bytes once encoded as UTF-8: the
 * chart library (4.6 MB, the same in every report of a process) comes as bytes encoded once per process,
 * so a report no longer copies and encodes it.
 */
export function renderReportChunks(model: ReportModel, assets: ReportAssets): PageChunk[] {
  const plotly = inlinedPlotly(assets);
  plotly.bytes ??= new TextEncoder().encode(plotly.text);
  return fillTemplateChunks(assets.html, pageValues(model, assets, plotly.hash, plotly.bytes));
}

/** The template's values for one page, with the inlined chart library as given (its text or its bytes) and its CSP hash. */
function pageValues<P extends PageChunk>(model: ReportModel, assets: ReportAssets, plotlyHash: string, plotlyJs: P): Record<string, string | P> {
  const pageJs = inlineScriptSource(assets.js);
  const labelled = new Set([...model.divergences].sort((a, b) => Math.abs(b.peakErrorDeg) - Math.abs(a.peakErrorDeg)).slice(0, 12));
  const { row: _rows, ...drawnSeries } = model.series;
  const pageData: ReportPageData = {
    title: model.title,
    imageName: model.meta.name !== '' ? model.meta.name : 'compass-debrief',
    series: drawnSeries,
    errorScaleDeg: model.errorScaleDeg,
    divergences: model.divergences.map((d) => ({
      label: d.label,
      startUtc: d.startUtc,
      endUtc: d.endUtc,
      peakUtc: d.peakUtc,
      showLabel: labelled.has(d),
    })),
    turns: model.turns.map((t) => ({ label: t.label, startUtc: t.startUtc, endUtc: t.endUtc })),
    episodes: model.episodes.map((e) => ({ label: e.label, startUtc: e.startUtc, endUtc: e.endUtc })),
    excursions: model.excursions.map((x) => ({ label: x.label, believedEastNm: x.believedEastNm, believedNorthNm: x.believedNorthNm })),
    unreliableSpans: model.unreliableSpans,
  };
  const g = model.glance;
  const subtitle = [
    model.meta.aircraft,
    model.meta.pilot,
    fmtUtcDateTime(g.startUtc),
    `${fmtDuration(g.durationS)} logged`,
  ]
    .filter((s) => s !== '')
    .join(' · ');
  const d = model.downsample;
  const drawnNote =
    d.drawn === d.samples
      ? `Every sample is drawn (${fmtCount(d.samples)}).`
      : `Drawn: ${fmtCount(d.drawn)} of ${fmtCount(d.samples)} samples (${d.method}). The samples CSV holds every sample.`;
  return {
    CSP: escapeHtml(reportCsp([plotlyHash, scriptHash(pageJs, assets)])),
    TITLE: escapeHtml(model.title),
    CSS: assets.css.replace(/<\/style/gi, '<\\/style'),
    SUBTITLE: escapeHtml(subtitle),
    CAUTION: escapeHtml(CAUTION_TEXT),
    GLANCE: glanceSection(model),
    DRAWN_NOTE: escapeHtml(drawnNote),
    EVENTS: eventTablesSection(model),
    HEALTH: logHealthSection(model),
    NOTES: methodNotesSection(model),
    FOOTER: escapeHtml(`Made by compass-debrief on ${model.generatedAtUtc.replace('T', ' ').replace(/\.\d+Z$/, ' UTC')} from ${model.source.file}. ${CAUTION_TEXT}`),
    DATA_JSON: jsonForScriptBlock(pageData),
    PLOTLY_JS: plotlyJs,
    REPORT_JS: pageJs,
  };
}
