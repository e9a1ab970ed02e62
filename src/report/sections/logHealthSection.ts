// Section 6, "How good the log is": what reading and cleaning did to the records, and every warning.
import type { ReportModel } from '../reportModelTypes.js';
import { escapeHtml } from '../escapeHtml.js';
import { fmtCount, fmtDuration, fmtNumber, fmtUtcTime } from '../pilotFormat.js';
import { fact } from './htmlParts.js';

/** Warnings listed on the page; the summary JSON has all of them. */
export const MAX_WARNINGS_SHOWN = 200;

/** HTML of the log-health section's body. */
export function logHealthSection(m: ReportModel): string {
  const h = m.health;
  const facts = [
    fact('Records read', fmtCount(h.recordsRead)),
    fact('Samples kept', fmtCount(h.samplesKept)),
    fact('Typical step', Number.isFinite(h.medianStepS) ? `${fmtNumber(h.medianStepS, 2)} s (${fmtNumber(1 / h.medianStepS, 1)} per second)` : '–'),
    fact('Repeated time stamps dropped', String(h.duplicateTimes)),
    fact('Out-of-order records', String(h.outOfOrder)),
    fact('Position jumps removed', String(h.positionSpikes)),
    fact('Invalid values', String(h.invalidValues)),
    fact('Gaps', String(h.gaps)),
    fact('Log ends early (truncated)', h.truncated ? 'yes: the last record was incomplete' : 'no'),
  ];
  const gaps =
    h.gapSpans.length === 0
      ? ''
      : `<p class="quiet">Gaps (the lines on the charts break there): ${escapeHtml(
          h.gapSpans
            .slice(0, 10)
            .map((g) => `${fmtUtcTime(g.t0Utc)} for ${fmtDuration(g.t1Utc - g.t0Utc)}`)
            .join('; ') + (h.gapSpans.length > 10 ? `; and ${h.gapSpans.length - 10} more` : ''),
        )}</p>`;
  const warnings =
    h.warnings.length === 0
      ? '<p class="empty" id="warnings-empty">No warnings: nothing in the log needed repair or comment.</p>'
      : `<ul class="warnings" id="warnings-list">${h.warnings
          .slice(0, MAX_WARNINGS_SHOWN)
          .map((w) => {
            const where =
              w.lines.length === 0 ? '' : ` Lines/records: ${w.lines.join(', ')}${w.lineCount > w.lines.length ? ` and ${w.lineCount - w.lines.length} more` : ''}.`;
            const count = w.count > 1 ? ` (${w.count}×)` : '';
            return `<li><code>${escapeHtml(w.code)}</code>${escapeHtml(count)} ${escapeHtml(w.message)}<span class="quiet">${escapeHtml(where)}</span></li>`;
          })
          .join('')}</ul>${
          h.warnings.length > MAX_WARNINGS_SHOWN
            ? `<p class="quiet">${escapeHtml(`and ${h.warnings.length - MAX_WARNINGS_SHOWN} more warnings, listed in the summary JSON.`)}</p>`
            : ''
        }`;
  return `<dl class="facts facts-wide">${facts.join('')}</dl>${gaps}<h3>Warnings</h3>${warnings}`;
}
