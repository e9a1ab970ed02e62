// A compass-swing record: the CSV of magnetic heading vs compass reading, and the report fitted to it.
import { requireCjs } from '../util/requireCjs.js';
import { MAX_DEVIATION_DEG } from '../constants.js';
import { OptionError, ParseError } from '../errors.js';
import { wrap180, wrap360 } from '../geo/angles.js';
import { correctionCard, type CardLine } from './correctionCard.js';
import { COMPASS_COLUMN, HEADING_COLUMN } from './swingColumns.js';
import { deviationAtDeg, fitSmithCoefficients, type SmithCoefficients } from './smithCoefficients.js';

const Papa = requireCjs('papaparse') as typeof import('papaparse');

/** The sign convention printed with every deviation. */
export const DEVIATION_SIGN_CONVENTION = 'deviation = magnetic − compass, easterly +; compass + deviation = magnetic';

/** One swung heading: the aircraft's magnetic heading (from a sight compass or surveyed line) and the compass reading [deg, [0, 360)]. */
export interface SwingRow {
  headingMagDeg: number;
  compassDeg: number;
  /** 1-based source line, when the row came from a file. */
  line?: number;
}

/** Per-row detail of a swing report [deg]. */
export interface SwingReportRow {
  heading_mag_deg: number;
  compass_deg: number;
  /** Observed deviation, magnetic − compass wrapped to (−180, 180], easterly +. */
  deviation_deg: number;
  /** Observed − fitted deviation. */
  residual_deg: number;
}

/**
 * The swing report (JSON field names as in DESIGN.md "Swing record"). All angles in degrees, full precision.
 * A_deg … E_deg: Smith's coefficients of δ(h) = A + B sin h + C cos h + D sin 2h + E cos 2h, h compass heading,
 * least squares over all rows; residuals_deg[i] observed − fitted deviation of row i; max_abs_deviation_deg the
 * largest |observed deviation|; over_limit the rows whose |observed deviation| exceeds limit_deg (10°,
 * 14 CFR 25.1327(b)); max_abs_fitted_deviation_deg and max_fitted_at_compass_deg the largest |δ| of the fitted
 * curve on a 0.1° grid of compass headings; card the correction card every 30° of magnetic heading.
 */
export interface SwingReport {
  sign_convention: string;
  A_deg: number;
  B_deg: number;
  C_deg: number;
  D_deg: number;
  E_deg: number;
  rows: SwingReportRow[];
  residuals_deg: number[];
  max_abs_deviation_deg: number;
  limit_deg: number;
  over_limit: { heading_mag_deg: number; compass_deg: number; deviation_deg: number }[];
  max_abs_fitted_deviation_deg: number;
  max_fitted_at_compass_deg: number;
  card: CardLine[];
}

const MIN_ROWS = 5;

/** 1-based line of the last character of text[0, end) that is not a line break. */
function lineCounter(text: string): (end: number) => number {
  let pos = 0;
  let line = 1;
  return (end: number) => {
    let e = end;
    while (e > 0 && (text[e - 1] === '\n' || text[e - 1] === '\r')) e--;
    for (; pos < e; pos++) if (text[pos] === '\n') line++;
    return line;
  };
}

function headingField(raw: unknown, column: string, line: number): number {
  const s = typeof raw === 'string' ? raw.trim() : '';
  const v = s === '' ? NaN : Number(s);
  if (!Number.isFinite(v) || v < 0 || v > 360) {
    throw new ParseError(`${column} must be a heading from 0 to 360 degrees, got "${s}"`, { line, hint: 'write headings as plain numbers, e.g. 045 or 44.5' });
  }
  return wrap360(v);
}

/**
 * Parses a swing record: CSV text (papaparse) with a header holding the columns heading_mag_deg and compass_deg
 * (any order, case-insensitive; other columns ignored), one row per heading swung, blank lines and lines starting
 * with # skipped. Headings in degrees 0–360 (360 is read as 000).
 * Throws ParseError (with the 1-based line) for a missing column, a value that is not a heading, a malformed row,
 * or fewer than 5 rows. Pure: text in, rows out.
 */
export function parseSwingRecord(text: string): SwingRow[] {
  const lineAt = lineCounter(text);
  const rows: SwingRow[] = [];
  let headingCol = -1;
  let compassCol = -1;
  let header = true;
  let failure: ParseError | undefined;
  Papa.parse<string[]>(text, {
    comments: '#',
    skipEmptyLines: 'greedy',
    step(result, parser) {
      const line = lineAt(result.meta.cursor);
      try {
        // A one-column file cannot show its delimiter; the header check below says what is missing instead.
        const errors = result.errors.filter((e) => e.type !== 'Delimiter');
        if (errors.length > 0) throw new ParseError(`malformed CSV row: ${errors[0].message}`, { line });
        const cells = result.data;
        if (header) {
          const names = cells.map((c) => c.trim().toLowerCase());
          headingCol = names.indexOf(HEADING_COLUMN);
          compassCol = names.indexOf(COMPASS_COLUMN);
          if (headingCol < 0 || compassCol < 0) {
            throw new ParseError(`the header needs columns ${HEADING_COLUMN} and ${COMPASS_COLUMN}, found: ${cells.join(', ')}`, { line });
          }
          header = false;
          return;
        }
        rows.push({
          headingMagDeg: headingField(cells[headingCol], HEADING_COLUMN, line),
          compassDeg: headingField(cells[compassCol], COMPASS_COLUMN, line),
          line,
        });
      } catch (err) {
        failure = err as ParseError;
        parser.abort();
      }
    },
  });
  if (failure) throw failure;
  if (header) throw new ParseError(`no header: a swing record needs columns ${HEADING_COLUMN} and ${COMPASS_COLUMN}`, { line: 1 });
  if (rows.length < MIN_ROWS) {
    throw new ParseError(`a swing needs at least ${MIN_ROWS} headings to fit Smith's coefficients A–E, found ${rows.length}`, {
      hint: 'swing every 30° (12 headings) or at least the 8 cardinal and intercardinal headings',
    });
  }
  return rows;
}

function coefficientsOf(rows: SwingRow[], deviationDeg: number[]): SmithCoefficients {
  try {
    return fitSmithCoefficients(
      rows.map((r) => r.compassDeg),
      deviationDeg,
    );
  } catch (err) {
    if (err instanceof OptionError) throw new ParseError(err.message.replace(/^headings: /, ''), { hint: 'swing at least 5 distinct headings spread round the card' });
    throw err;
  }
}

/**
 * The swing report for rows of (magnetic heading, compass reading): observed deviation δ = magnetic − compass
 * (wrapped, easterly +), Smith's A–E by least squares on the compass headings, residuals, the 10° limit check
 * (14 CFR 25.1327(b)) and a 30° correction card. See SwingReport for the fields.
 * Throws ParseError when the rows cannot determine A–E (fewer than 5, or fewer than 5 distinct compass headings).
 */
export function swingReport(rows: SwingRow[]): SwingReport {
  const deviationDeg = rows.map((r) => wrap180(r.headingMagDeg - r.compassDeg));
  const c = coefficientsOf(rows, deviationDeg);
  const reportRows: SwingReportRow[] = rows.map((r, i) => ({
    heading_mag_deg: r.headingMagDeg,
    compass_deg: r.compassDeg,
    deviation_deg: deviationDeg[i],
    residual_deg: deviationDeg[i] - deviationAtDeg(c, r.compassDeg),
  }));
  let maxFitted = 0;
  let maxFittedAt = 0;
  for (let k = 0; k < 3600; k++) {
    const d = Math.abs(deviationAtDeg(c, k / 10));
    if (d > maxFitted) {
      maxFitted = d;
      maxFittedAt = k / 10;
    }
  }
  return {
    sign_convention: DEVIATION_SIGN_CONVENTION,
    A_deg: c.aDeg,
    B_deg: c.bDeg,
    C_deg: c.cDeg,
    D_deg: c.dDeg,
    E_deg: c.eDeg,
    rows: reportRows,
    residuals_deg: reportRows.map((r) => r.residual_deg),
    max_abs_deviation_deg: Math.max(...deviationDeg.map(Math.abs)),
    limit_deg: MAX_DEVIATION_DEG,
    over_limit: reportRows
      .filter((r) => Math.abs(r.deviation_deg) > MAX_DEVIATION_DEG)
      .map((r) => ({ heading_mag_deg: r.heading_mag_deg, compass_deg: r.compass_deg, deviation_deg: r.deviation_deg })),
    max_abs_fitted_deviation_deg: maxFitted,
    max_fitted_at_compass_deg: maxFittedAt,
    card: correctionCard(c, 30),
  };
}
