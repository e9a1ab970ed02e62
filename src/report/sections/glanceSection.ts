// Section 1, "The flight in brief": when, where, with what, the wind and field used, the worst errors.
import { angleDiffDeg, circularMeanDeg } from '../../geo/angles.js';
import type { ReportModel, ReportWind } from '../reportModelTypes.js';
import { escapeHtml } from '../escapeHtml.js';
import { fmtDuration, fmtHeading, fmtLatLon, fmtNumber, fmtSignedDeg, fmtUtcDateTime, fmtUtcTime } from '../pilotFormat.js';
import { fact, headRow, jumpRow, td } from './htmlParts.js';

/** Variation as printed on charts: "3.2° W", "0.4° E" (east +). */
export function fmtVariation(deg: number): string {
  if (!Number.isFinite(deg)) return '–';
  const s = `${Math.abs(deg).toFixed(1)}°`;
  return Number(Math.abs(deg).toFixed(1)) === 0 ? s : `${s} ${deg > 0 ? 'E' : 'W'}`;
}

/** Bank as "18° R" / "12° L" (right wing down +). */
export function fmtBank(deg: number): string {
  if (!Number.isFinite(deg)) return '–';
  const r = Math.round(Math.abs(deg));
  return r === 0 ? '0°' : `${r}° ${deg > 0 ? 'R' : 'L'}`;
}

function range(lo: string, hi: string): string {
  return lo === hi ? lo : `${lo} to ${hi}`;
}

function windLine(w: ReportWind): string {
  const sigma = Number.isFinite(w.sigmaKt) ? ` ± ${fmtNumber(w.sigmaKt, 1)} kt` : '';
  return `${fmtHeading(w.fromDegTrue)} true / ${fmtNumber(w.speedKt, 0)} kt${sigma}`;
}
function windWhen(w: ReportWind): string {
  return Number.isFinite(w.t0Utc) && Number.isFinite(w.t1Utc) ? `, ${fmtUtcTime(w.t0Utc)} to ${fmtUtcTime(w.t1Utc)}` : '';
}

/**
 * The wind used: each estimate when there are one or two; otherwise one summary line (circular mean
 * direction, mean speed, the spread) with every estimate listed in a closed <details>.
 */
function windBlock(winds: ReportWind[]): string {
  if (winds.length === 0) {
    return '<p class="empty">No wind estimate was made: headings are taken equal to the ground track, which is wrong by the drift angle.</p>';
  }
  const item = (w: ReportWind) => `<li>${escapeHtml(windLine(w))} <span class="quiet">${escapeHtml(`(${w.sourceText}${windWhen(w)})`)}</span></li>`;
  if (winds.length <= 2) return `<ul class="winds">${winds.map(item).join('')}</ul>`;
  const from = circularMeanDeg(winds.map((w) => w.fromDegTrue));
  const speeds = winds.map((w) => w.speedKt).filter((v) => Number.isFinite(v));
  const meanKt = speeds.reduce((a, b) => a + b, 0) / Math.max(1, speeds.length);
  const spreadDeg = Math.max(...winds.map((w) => Math.abs(angleDiffDeg(w.fromDegTrue, from))));
  const sources = [...new Set(winds.map((w) => w.sourceText))].join('; ');
  const summary = `${fmtHeading(from)} true / ${fmtNumber(meanKt, 0)} kt on average`;
  const lo = fmtNumber(Math.min(...speeds), 0);
  const hi = fmtNumber(Math.max(...speeds), 0);
  const detail = `${winds.length} estimates (${sources}), directions within ±${fmtNumber(spreadDeg, 0, '°')}, ${lo === hi ? `all ${lo} kt` : `speeds ${lo} to ${hi} kt`}`;
  return `<p class="wind-summary"><strong>${escapeHtml(summary)}</strong><br><span class="quiet">${escapeHtml(detail)}</span></p>
<details class="winds"><summary>Each estimate</summary><ul class="winds">${winds.map(item).join('')}</ul></details>`;
}

/** HTML of the glance section's body (facts, wind, field, headline errors). */
export function glanceSection(m: ReportModel): string {
  const g = m.glance;
  const who: string[] = [];
  if (m.meta.aircraft !== '') who.push(fact('Aircraft', m.meta.aircraft));
  if (m.meta.pilot !== '') who.push(fact('Pilot', m.meta.pilot));
  if (m.meta.device !== '') who.push(fact('Recorder', m.meta.device));
  if (m.meta.comment !== '') who.push(fact('Log comment', m.meta.comment));

  const when = [
    fact('Date', fmtUtcDateTime(g.startUtc).slice(0, 10)),
    fact('Logged', `${fmtUtcTime(g.startUtc)} to ${fmtUtcTime(g.endUtc)}`),
    fact('Duration', fmtDuration(g.durationS)),
    fact('First fix', fmtLatLon(g.startLatDeg, g.startLonDeg)),
    fact('Last fix', fmtLatLon(g.endLatDeg, g.endLonDeg)),
    fact('Farthest from first fix', fmtNumber(g.maxRangeNm, 1, ' NM')),
    fact('Altitude', `${range(fmtNumber(g.altMinFt, 0), fmtNumber(g.altMaxFt, 0))} ft (${g.altDatum === 'msl' ? 'above mean sea level' : g.altDatum === 'ellipsoid' ? 'above the WGS-84 ellipsoid' : g.altDatum === 'pressure' ? 'pressure altitude' : 'datum unknown'})`),
    fact('Highest ground speed', fmtNumber(g.gsMaxKt, 0, ' kt')),
    fact('Log file', `${m.source.file} (${m.source.format.toUpperCase()})`),
    ...who,
  ];

  const winds = windBlock(g.winds);

  const zones: string[] = [];
  if (g.cautionZoneSamples > 0) zones.push(`${g.cautionZoneSamples} samples in the WMM caution zone (weak horizontal field)`);
  if (g.blackoutZoneSamples > 0) zones.push(`${g.blackoutZoneSamples} samples in the WMM blackout zone (compass unusable)`);
  const field = [
    fact('Variation', range(fmtVariation(g.variationMinDeg), fmtVariation(g.variationMaxDeg))),
    fact('Dip', `${range(fmtNumber(g.dipMinDeg, 1, '°'), fmtNumber(g.dipMaxDeg, 1, '°'))} (${g.dipMaxDeg < 0 ? 'north end up' : 'north end down'})`),
    fact('Field model', `${g.fieldModel}, epoch ${fmtNumber(g.decimalYear, 2)}`),
    fact('Weak-field zones', zones.length === 0 ? 'none along the path' : zones.join('; ')),
  ];

  const headline = [
    fact('Largest compass error (card reliable)', `${fmtNumber(g.maxAbsErrorDeg, 0, '°')}${g.biggestErrors.length > 0 ? ` at ${fmtUtcTime(g.biggestErrors[0].tUtc)}` : ''}`),
    fact('Typical (RMS) error', fmtNumber(g.rmsErrorDeg, 1, '°')),
    fact('Readings flagged unreliable', `${fmtNumber(100 * g.unreliableShare, 1)} % of the flight`),
  ];

  const peakRows = g.biggestErrors.map((p, k) =>
    jumpRow(
      [
        td(`${k + 1}`),
        td(fmtUtcTime(p.tUtc)),
        td(fmtSignedDeg(p.errorDeg), 'num'),
        td(fmtHeading(p.compassDeg), 'num'),
        td(fmtHeading(p.headingMagDeg), 'num'),
        td(fmtBank(p.bankDeg), 'num'),
        td(p.mainCause),
      ],
      p.tUtc,
      p.tUtc - 60,
      p.tUtc + 60,
      `error peak ${k + 1}`,
    ),
  );
  const peaks =
    peakRows.length === 0
      ? '<p class="empty">No compass error could be computed for this flight.</p>'
      : `<p class="table-caption" id="peaks-table-caption">The biggest compass errors, at least a minute apart. Click a row to see the moment.</p><div class="table-wrap"><table id="peaks-table" aria-describedby="peaks-table-caption"><thead>${headRow([
          ['#'],
          ['Time', 'UTC'],
          ['Error', 'compass − magnetic'],
          ['Compass read'],
          ['Magnetic heading'],
          ['Bank'],
          ['Main cause'],
        ])}</thead><tbody>${peakRows.join('')}</tbody></table></div>`;

  return `<div class="glance-grid">
<div class="panel glance-when"><h3>When, where, who</h3><dl class="facts">${when.join('')}</dl></div>
<div class="panel glance-field"><h3>Wind used</h3>${winds}<h3>Magnetic field along the path</h3><dl class="facts">${field.join('')}</dl></div>
<div class="panel headline"><h3>How far the compass strayed</h3><dl class="facts">${headline.join('')}</dl></div>
<div class="glance-peaks">${peaks}</div>
</div>`;
}
