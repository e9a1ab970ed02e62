// The turn plan: a small CSV of intended roll-out headings, one row per intended turn, matched to the turns in order.
import { ParseError } from '../errors.js';
import { wrap360 } from '../geo/angles.js';
import { parseIsoDateTime } from '../import/isoTime.js';

/**
 * One plan row. targetMagDeg [0, 360) magnetic; notBeforeT: UTC seconds the row is anchored to (NaN: none);
 * timedS: planned duration of a timed turn [s] (NaN: not timed); line: 1-based line in the plan text.
 */
export interface PlanRow {
  line: number;
  targetMagDeg: number;
  notBeforeT: number;
  timedS: number;
  label: string;
}

/** Splits one CSV line at commas, honouring double quotes ("" inside quotes is a quote). */
function splitCsvLine(line: string): string[] {
  const out: string[] = [];
  let cur = '';
  let q = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (q) {
      if (ch === '"' && line[i + 1] === '"') {
        cur += '"';
        i++;
      } else if (ch === '"') q = false;
      else cur += ch;
    } else if (ch === '"') q = true;
    else if (ch === ',') {
      out.push(cur);
      cur = '';
    } else cur += ch;
  }
  out.push(cur);
  return out.map((s) => s.trim());
}

/**
 * Parses plan CSV text (pure: text in, rows out).
 * Format: a header row naming the columns (case-insensitive, any order): `target_mag_deg` (required; magnetic
 * heading to roll out on, 0–360, 360 = 0), `not_before_utc` (optional; ISO 8601 date-time, e.g.
 * 2026-05-04T10:12:00Z; a value without a zone is taken as UTC), `timed_s` (optional; planned time of a timed
 * turn, > 0 s), `label` (optional text); other columns are ignored. Blank lines and lines starting with `#` are
 * skipped; a UTF-8 byte-order mark is dropped. Empty optional cells mean "none".
 * @throws ParseError with the 1-based line for: no header, no target_mag_deg column, a target that is empty, not a
 *   number or outside 0–360, a bad not_before_utc or timed_s, or no rows at all.
 * @example parsePlanCsv('target_mag_deg\n090\n000\n') → rows with targets 90 and 0 (lines 2 and 3).
 */
// Format: ours (DESIGN.md "Plan file"); CSV quoting as RFC 4180 within a line.
export function parsePlanCsv(text: string): PlanRow[] {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  let header: string[] | undefined;
  let headerLine = 0;
  const rows: PlanRow[] = [];
  let iTarget = -1;
  let iNotBefore = -1;
  let iTimed = -1;
  let iLabel = -1;
  for (let k = 0; k < lines.length; k++) {
    const lineNo = k + 1;
    const raw = lines[k];
    if (raw.trim() === '' || raw.trimStart().startsWith('#')) continue;
    const cells = splitCsvLine(raw);
    if (!header) {
      header = cells.map((c) => c.toLowerCase());
      headerLine = lineNo;
      iTarget = header.indexOf('target_mag_deg');
      iNotBefore = header.indexOf('not_before_utc');
      iTimed = header.indexOf('timed_s');
      iLabel = header.indexOf('label');
      if (iTarget < 0) {
        throw new ParseError(`the header has no target_mag_deg column (found: ${cells.join(', ') || 'nothing'})`, {
          line: lineNo,
          hint: 'the first row must name the columns, e.g. target_mag_deg,not_before_utc',
        });
      }
      continue;
    }
    const cell = (i: number): string => (i >= 0 && i < cells.length ? cells[i] : '');
    const tText = cell(iTarget);
    const target = tText === '' ? NaN : Number(tText);
    if (!(Number.isFinite(target) && target >= 0 && target <= 360)) {
      throw new ParseError(`target_mag_deg "${tText}" is not a heading from 0 to 360`, { line: lineNo });
    }
    const nbText = cell(iNotBefore);
    let notBeforeT = NaN;
    if (nbText !== '') {
      notBeforeT = parseIsoDateTime(nbText);
      if (!Number.isFinite(notBeforeT)) {
        throw new ParseError(`not_before_utc "${nbText}" is not an ISO 8601 date-time (e.g. 2026-05-04T10:12:00Z)`, { line: lineNo });
      }
    }
    const tsText = cell(iTimed);
    let timedS = NaN;
    if (tsText !== '') {
      timedS = Number(tsText);
      if (!(Number.isFinite(timedS) && timedS > 0)) {
        throw new ParseError(`timed_s "${tsText}" is not a positive number of seconds`, { line: lineNo });
      }
    }
    rows.push({ line: lineNo, targetMagDeg: wrap360(target), notBeforeT, timedS, label: cell(iLabel) });
  }
  if (!header) throw new ParseError('the plan is empty (no header row)', { line: 1 });
  if (rows.length === 0) throw new ParseError('the plan has a header but no rows', { line: headerLine });
  return rows;
}

/** Result of matching plan rows to turns: rowOfTurn[k] = index into rows for turn k, or −1; rows left over. */
export interface PlanMatch {
  rowOfTurn: Int32Array;
  unmatchedRows: PlanRow[];
}

/**
 * Matches plan rows to turns in order: each row takes the next unmatched turn; a row with notBeforeT first skips
 * the turns that start before that time (so one anchor realigns the plan after unplanned turns). Rows with no turn
 * left are returned in unmatchedRows. Turn start times must be in ascending order.
 */
// Method: ours (in-order matching with optional time anchors; DESIGN.md "Plan file").
export function matchPlanToTurns(rows: readonly PlanRow[], turnStartT: ArrayLike<number>): PlanMatch {
  const rowOfTurn = new Int32Array(turnStartT.length).fill(-1);
  const unmatchedRows: PlanRow[] = [];
  let next = 0;
  rows.forEach((row, r) => {
    if (Number.isFinite(row.notBeforeT)) while (next < turnStartT.length && turnStartT[next] < row.notBeforeT) next++;
    if (next < turnStartT.length) rowOfTurn[next++] = r;
    else unmatchedRows.push(row);
  });
  return { rowOfTurn, unmatchedRows };
}
