// index.html of a batch folder: every flight of the run with its status and a link to its debrief, and
// from the catalogue each pilot's compass-turn grades across lessons and each aircraft's error across the season.
// Self-contained and offline: inline CSS, inline SVG charts, no script at all (CSP script-src 'none').
import { escapeHtml } from '../report/escapeHtml.js';
import { fmtDuration, fmtNumber, fmtUtcDateTime, fmtUtcTime } from '../report/pilotFormat.js';
import { reportCsp } from '../report/renderReport.js';
import { CAUTION_TEXT } from '../report/sections/methodNotesSection.js';
import type { BatchOverview, OverviewFlight, RunState } from './batchOverview.js';
import type { CatalogueRow } from './flightCatalogue.js';
import { reportFiles } from './reportNames.js';
import { trendChartSvg } from './trendChartSvg.js';

/** Okabe & Ito, "Color Universal Design" (2008): blue, vermillion (as the debrief page uses). */
const BLUE = '#0072b2';
const VERMILLION = '#d55e00';

const RUN_TEXT: Record<RunState, string> = {
  analysed: 'analysed',
  unchanged: 'unchanged, kept',
  duplicate: 'copy of another input',
  unread: 'not read',
};

const CSS = `
:root { --ink:#1c1f24; --soft:#4a505a; --paper:#fbfaf6; --rule:#d9d6cc; --amber:#e69f00; --bad:#b3261e; --ok:#00734f; }
* { box-sizing: border-box; }
body { margin:0; background:var(--paper); color:var(--ink); font:15px/1.5 system-ui, -apple-system, "Segoe UI", Roboto, "Noto Sans", "Liberation Sans", Arial, sans-serif; }
header { background:#1f2a36; color:#f3f1ea; border-bottom:4px solid var(--amber); padding:16px 20px 10px; }
header h1 { margin:0; font-size:26px; } header p { margin:2px 0 6px; color:#d6d1c4; }
main { max-width:1180px; margin:0 auto; padding:0 20px 40px; }
.caution { max-width:1180px; margin:10px auto 0; padding:0 20px; font-size:13.5px; color:var(--soft); }
section { margin-top:24px; border-top:1px solid var(--rule); }
h2 { font-size:20px; margin:10px 0 6px; } h3 { font-size:15.5px; margin:16px 0 4px; }
table { border-collapse:collapse; width:100%; font-size:13.5px; margin:6px 0 10px; }
th, td { text-align:left; padding:4px 8px; border-bottom:1px solid var(--rule); vertical-align:top; }
td { overflow-wrap:break-word; } td a { overflow-wrap:anywhere; }
th { font-weight:600; background:#f1efe7; } td.num { text-align:right; font-variant-numeric:tabular-nums; white-space:nowrap; }
.ok { color:var(--ok); font-weight:600; } .failed { color:var(--bad); font-weight:600; } .err { color:var(--bad); font-size:12.5px; }
.note { color:var(--soft); font-size:12.5px; }
.trend-figure { margin:6px 0; } .trend { max-width:100%; height:auto; background:#fff; border:1px solid var(--rule); }
figcaption { font-size:12.5px; color:var(--soft); } .key { margin-right:12px; }
.swatch { display:inline-block; width:10px; height:10px; margin-right:4px; vertical-align:middle; border-radius:2px; }
footer { margin-top:30px; font-size:12.5px; color:var(--soft); }
@media print { header { background:none; color:var(--ink); } header p { color:var(--soft); } }
`;

function td(text: string, cls = ''): string {
  return `<td${cls ? ` class="${cls}"` : ''}>${escapeHtml(text)}</td>`;
}

/** Link to a flight's debrief (relative, in the same folder), or its path as text when there is none. */
function flightLink(path: string, reportBase: string): string {
  if (reportBase === '') return escapeHtml(path);
  return `<a href="${escapeHtml(encodeURIComponent(reportFiles(reportBase).html))}">${escapeHtml(path)}</a>`;
}

function deg(x: number, decimals = 1): string {
  return fmtNumber(x, decimals, '°');
}

function turnsText(r: CatalogueRow): string {
  if (r.status !== 'ok') return '–';
  return `${r.turnsFlown} flown, ${r.turnsGraded} graded, ${r.turnsWithinTolerance} within tolerance`;
}

function flightRow(f: OverviewFlight): string {
  const r = f.row;
  const ok = r.status === 'ok';
  const status = ok
    ? `<td class="ok">ok</td>`
    : `<td><span class="failed">failed</span><br><span class="err">${escapeHtml(r.error)}</span></td>`;
  const when = ok && Number.isFinite(r.maxErrorT) ? `${deg(r.maxAbsErrorDeg, 0)} at ${fmtUtcTime(r.maxErrorT)}` : '–';
  const run = `${RUN_TEXT[f.run]}${f.note !== '' ? ` (${f.note})` : ''}`;
  return `<tr><td>${flightLink(f.inputPath, ok ? r.reportBase : '')}</td>${td(r.pilot || '–')}${td(r.aircraft || '–')}${td(fmtUtcDateTime(r.startT))}${td(
    fmtDuration(r.durationS),
    'num',
  )}${td(when, 'num')}${td(turnsText(r))}${td(ok ? String(r.warnings) : '–', 'num')}${status}<td class="note">${escapeHtml(run)}</td></tr>`;
}

/** Catalogue rows with status ok and a non-empty tag, grouped by that tag (name order), each group oldest first. */
export function groupByTag(rows: CatalogueRow[], tag: 'pilot' | 'aircraft'): [string, CatalogueRow[]][] {
  const groups = new Map<string, CatalogueRow[]>();
  for (const r of rows) {
    const name = r[tag].trim();
    if (r.status !== 'ok' || name === '') continue;
    const g = groups.get(name) ?? [];
    g.push(r);
    groups.set(name, g);
  }
  for (const g of groups.values()) g.sort((a, b) => (a.startT - b.startT) || (a.inputPath < b.inputPath ? -1 : 1));
  return [...groups.entries()].sort((a, b) => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0));
}

function pilotSection(name: string, rows: CatalogueRow[]): string {
  const chart = trendChartSvg(`${name}: mean roll-out error per lesson`, '°', [
    {
      name: 'mean |roll-out error|',
      colour: BLUE,
      points: rows.map((r) => ({ tUtc: r.startT, value: r.meanAbsRolloutErrorDeg, label: `${fmtUtcDateTime(r.startT)}, ${deg(r.meanAbsRolloutErrorDeg)}, ${r.turnsWithinTolerance} of ${r.turnsGraded} within tolerance` })),
    },
  ]);
  const body = rows
    .map((r) => {
      const share = r.turnsGraded > 0 ? ` (${Math.round((100 * r.turnsWithinTolerance) / r.turnsGraded)} %)` : '';
      return `<tr>${td(fmtUtcDateTime(r.startT))}<td>${flightLink(r.inputPath, r.reportBase)}</td>${td(r.aircraft || '–')}${td(String(r.turnsGraded), 'num')}${td(
        `${r.turnsWithinTolerance}${share}`,
        'num',
      )}${td(deg(r.meanAbsRolloutErrorDeg), 'num')}</tr>`;
    })
    .join('');
  return `<h3>${escapeHtml(name)}</h3>${chart || '<p class="note">No graded turns in these lessons yet.</p>'}<table><thead><tr><th>Date (UTC)</th><th>Lesson</th><th>Aircraft</th><th>Turns graded</th><th>Within tolerance</th><th>Mean |roll-out error|</th></tr></thead><tbody>${body}</tbody></table>`;
}

function cardText(r: CatalogueRow): string {
  const d = r.deviation;
  if (!d) return 'none applied';
  return `A ${fmtNumber(d.aDeg, 1)}, B ${fmtNumber(d.bDeg, 1)}, C ${fmtNumber(d.cDeg, 1)}, D ${fmtNumber(d.dDeg, 1)}, E ${fmtNumber(d.eDeg, 1)}`;
}

function aircraftSection(name: string, rows: CatalogueRow[]): string {
  const label = (r: CatalogueRow, v: number) => `${fmtUtcDateTime(r.startT)}, ${deg(v)}${r.pilot ? `, ${r.pilot}` : ''}`;
  const chart = trendChartSvg(`${name}: compass error per flight`, '°', [
    { name: 'largest |compass error|', colour: VERMILLION, points: rows.map((r) => ({ tUtc: r.startT, value: r.maxAbsErrorDeg, label: label(r, r.maxAbsErrorDeg) })) },
    { name: 'RMS compass error', colour: BLUE, points: rows.map((r) => ({ tUtc: r.startT, value: r.rmsErrorDeg, label: label(r, r.rmsErrorDeg) })) },
  ]);
  const body = rows
    .map(
      (r) =>
        `<tr>${td(fmtUtcDateTime(r.startT))}<td>${flightLink(r.inputPath, r.reportBase)}</td>${td(r.pilot || '–')}${td(deg(r.maxAbsErrorDeg), 'num')}${td(deg(r.rmsErrorDeg, 2), 'num')}${td(
          cardText(r),
        )}</tr>`,
    )
    .join('');
  return `<h3>${escapeHtml(name)}</h3>${chart}<table><thead><tr><th>Date (UTC)</th><th>Flight</th><th>Pilot</th><th>Largest |error|</th><th>RMS error</th><th>Deviation card (Smith A–E, °, easterly +)</th></tr></thead><tbody>${body}</tbody></table>`;
}

/**
 * Renders the overview page. Pure: the same overview gives the same string. Every text from logs, tags,
 * paths and errors is HTML-escaped; links are relative file names, percent-encoded.
 */
export function overviewHtml(o: BatchOverview): string {
  const n = o.flights.length;
  const ok = o.flights.filter((f) => f.row.status === 'ok').length;
  const analysed = o.flights.filter((f) => f.run === 'analysed').length;
  const kept = o.flights.filter((f) => f.run === 'unchanged').length;
  const counts = `${n} flight log${n === 1 ? '' : 's'}: ${ok} ok, ${n - ok} failed; ${analysed} analysed in this run, ${kept} unchanged and kept`;
  const pilots = groupByTag(o.catalogue, 'pilot');
  const aircraft = groupByTag(o.catalogue, 'aircraft');
  const skipped =
    o.skipped.length === 0
      ? ''
      : `<section id="skipped"><h2>Left out</h2><ul>${o.skipped.map((s) => `<li>${escapeHtml(s.path)}: ${escapeHtml(s.note)}</li>`).join('')}</ul></section>`;
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${escapeHtml(reportCsp(["'none'"]))}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="referrer" content="no-referrer">
<title>${escapeHtml(`Batch debrief: ${counts}`)}</title>
<style>${CSS}</style>
</head>
<body>
<header><h1>Batch debrief</h1><p>${escapeHtml(counts)}</p><p>${escapeHtml(o.optionsText)}</p></header>
<p class="caution">${escapeHtml(CAUTION_TEXT)}</p>
<main>
<section id="flights"><h2>Flights</h2>
<table><thead><tr><th>Log (link to its debrief)</th><th>Pilot</th><th>Aircraft</th><th>Start (UTC)</th><th>Duration</th><th>Largest compass error</th><th>Turns</th><th>Warnings</th><th>Status</th><th>This run</th></tr></thead>
<tbody>${o.flights.map(flightRow).join('\n')}</tbody></table></section>
<section id="pilots"><h2>Compass-turn grades by pilot</h2>
${pilots.length > 0 ? pilots.map(([name, rows]) => pilotSection(name, rows)).join('\n') : '<p class="note">No flight carries a pilot tag (log meta, a &lt;log&gt;.tags.json side file, or --pilot).</p>'}
</section>
<section id="aircraft"><h2>Compass error by aircraft</h2>
${aircraft.length > 0 ? aircraft.map(([name, rows]) => aircraftSection(name, rows)).join('\n') : '<p class="note">No flight carries an aircraft tag (log meta, a &lt;log&gt;.tags.json side file, or --aircraft).</p>'}
</section>
${skipped}
<footer>${escapeHtml(`Made by compass-debrief ${o.toolVersion} on ${o.generatedAtUtc.replace('T', ' ').replace(/\.\d+Z$/, ' UTC')}. Trends include every flight catalogued in this folder (catalogue.sqlite). ${CAUTION_TEXT}`)}</footer>
</main>
</body>
</html>
`;
}
