// overview.csv: one row per input of the batch run, the same facts as the overview page.
import type { OverviewFlight } from './batchOverview.js';
import { reportFiles } from './reportNames.js';

/** Header of overview.csv, in this order. */
export const OVERVIEW_CSV_COLUMNS = [
  'file',
  'report',
  'status',
  'error',
  'this_run',
  'note',
  'pilot',
  'aircraft',
  'start_utc',
  'duration_s',
  'max_abs_error_deg',
  'max_error_utc',
  'rms_error_deg',
  'turns_flown',
  'turns_graded',
  'turns_within_tolerance',
  'mean_abs_rollout_error_deg',
  'warnings',
  'content_sha256',
] as const;

/**
 * A text field for CSV: quoted when it holds a comma, quote, CR or LF, quotes doubled (RFC 4180 §2);
 * text starting with = + − @ tab or CR gets a leading apostrophe so spreadsheets do not run it as a
 * formula (OWASP, "CSV Injection").
 */
export function csvText(s: string): string {
  const safe = /^[=+\-@\t\r]/.test(s) ? `'${s}` : s;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

function csvNum(x: number, decimals: number): string {
  return Number.isFinite(x) ? String(Number(x.toFixed(decimals))) : '';
}

function csvUtc(t: number): string {
  return Number.isFinite(t) ? new Date(Math.round(t * 1000)).toISOString() : '';
}

/** overview.csv text (CRLF line ends per RFC 4180; empty field where a value is missing). Pure. */
export function overviewCsv(flights: OverviewFlight[]): string {
  const lines = [OVERVIEW_CSV_COLUMNS.join(',')];
  for (const f of flights) {
    const r = f.row;
    const ok = r.status === 'ok';
    lines.push(
      [
        csvText(f.inputPath),
        csvText(ok && r.reportBase !== '' ? reportFiles(r.reportBase).html : ''),
        r.status,
        csvText(r.error),
        f.run,
        csvText(f.note),
        csvText(r.pilot),
        csvText(r.aircraft),
        csvUtc(r.startT),
        csvNum(r.durationS, 1),
        csvNum(r.maxAbsErrorDeg, 1),
        csvUtc(r.maxErrorT),
        csvNum(r.rmsErrorDeg, 2),
        ok ? csvNum(r.turnsFlown, 0) : '',
        ok ? csvNum(r.turnsGraded, 0) : '',
        ok ? csvNum(r.turnsWithinTolerance, 0) : '',
        csvNum(r.meanAbsRolloutErrorDeg, 1),
        ok ? csvNum(r.warnings, 0) : '',
        r.contentSha256,
      ].join(','),
    );
  }
  return lines.join('\r\n') + '\r\n';
}
