// --wind FILE: a small wind table, by altitude or by time. Columns: alt_ft (or alt_m) or time_utc, and
// wind as DDD/SS (from, true, knots) or as from_deg + speed_kt. Lines starting with # are comments.
import { readSideFileText } from '../src/import/readSideFile.js';
import { requireCjs } from '../src/util/requireCjs.js';
import { FT_M, KT_MS } from '../src/constants.js';
import { InputError } from '../src/errors.js';
import type { WindOption, WindTableRow } from '../src/state/windOption.js';

const Papa = requireCjs('papaparse') as typeof import('papaparse');

/** Reads a wind table file into a WindOption of kind 'table'. Every problem names the file and line. */
export async function readWindTable(file: string): Promise<WindOption> {
  const text = await readSideFileText(file, 'wind table');
  const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: 'greedy', comments: '#', transformHeader: (h) => h.trim().toLowerCase() });
  const fields = parsed.meta.fields ?? [];
  const has = (f: string) => fields.includes(f);
  const key = has('alt_ft') ? 'alt_ft' : has('alt_m') ? 'alt_m' : has('time_utc') ? 'time_utc' : undefined;
  const hint = 'a wind table has a column alt_ft, alt_m or time_utc, and wind (DDD/SS) or from_deg and speed_kt';
  if (!key) throw new InputError(file, 'no alt_ft, alt_m or time_utc column', { line: 1, hint });
  if (!has('wind') && !(has('from_deg') && has('speed_kt'))) throw new InputError(file, 'no wind column (DDD/SS) nor from_deg and speed_kt', { line: 1, hint });
  const rows: WindTableRow[] = [];
  parsed.data.forEach((r, k) => {
    const line = k + 2;
    let fromDeg: number;
    let speedKt: number;
    if (has('wind')) {
      const m = /^\s*(\d{1,3}(?:\.\d+)?)\s*\/\s*(\d{1,3}(?:\.\d+)?)\s*$/.exec(r.wind ?? '');
      if (!m) throw new InputError(file, `wind '${r.wind ?? ''}' is not DDD/SS`, { line, hint: 'e.g. 250/20: from 250° true at 20 kt' });
      fromDeg = Number(m[1]);
      speedKt = Number(m[2]);
    } else {
      fromDeg = Number(r.from_deg);
      speedKt = Number(r.speed_kt);
    }
    if (!(fromDeg >= 0 && fromDeg <= 360)) throw new InputError(file, `wind direction ${fromDeg} is outside 0 to 360°`, { line });
    if (!(speedKt >= 0 && speedKt <= 200)) throw new InputError(file, `wind speed ${speedKt} kt is outside 0 to 200 kt`, { line });
    const row: WindTableRow = { fromDegTrue: fromDeg % 360, speedMs: speedKt * KT_MS };
    const v = r[key] ?? '';
    if (key === 'time_utc') {
      const t = Date.parse(v);
      if (!Number.isFinite(t) || !/(Z|[+-]\d\d:?\d\d)$/i.test(v.trim())) throw new InputError(file, `time '${v}' is not an ISO 8601 UTC time`, { line, hint: 'e.g. 2026-05-04T10:30:00Z' });
      row.t = t / 1000;
    } else {
      const a = Number(v);
      if (!Number.isFinite(a) || v.trim() === '') throw new InputError(file, `altitude '${v}' is not a number`, { line });
      row.altM = key === 'alt_ft' ? a * FT_M : a;
    }
    rows.push(row);
  });
  if (rows.length === 0) throw new InputError(file, 'the wind table has no rows', { hint });
  return { kind: 'table', rows };
}
