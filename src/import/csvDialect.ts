// Guessing a delimited text file's dialect: field delimiter, decimal mark, line break.

/** Delimiters tried, in order of preference on a tie. */
export const CSV_DELIMITERS = [',', ';', '\t', '|'] as const;
export type CsvDelimiter = (typeof CSV_DELIMITERS)[number];

export interface CsvDialect {
  delimiter: CsvDelimiter;
  decimalComma: boolean;
  newline: '\n' | '\r\n' | '\r';
}

/** Splits a line on a delimiter, honouring double quotes (enough for guessing; the real split is papaparse's). */
function countFields(line: string, delimiter: string): number {
  let n = 1;
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i];
    if (c === '"') quoted = !quoted;
    else if (c === delimiter && !quoted) n++;
  }
  return n;
}

/** First line break style found in the text ('\n' when there is none). */
export function detectNewline(text: string): CsvDialect['newline'] {
  const lf = text.indexOf('\n');
  const cr = text.indexOf('\r');
  if (lf < 0 && cr < 0) return '\n';
  if (lf < 0) return '\r';
  if (cr >= 0 && cr === lf - 1) return '\r\n';
  if (cr >= 0 && cr < lf) return '\r';
  return '\n';
}

/**
 * Guesses the delimiter from the first lines of a file (sample: up to ~64 kB): the candidate that splits
 * the most lines into the same number (≥ 2) of fields as the header line wins. A decimal comma is assumed
 * when the delimiter is not a comma and data fields look like `12,5`. (Heuristic: common practice of
 * spreadsheet exports; a file can force both through CsvOptions.)
 */
export function detectCsvDialect(sample: string): CsvDialect {
  const newline = detectNewline(sample);
  const lines = sample
    .split(/\r\n|\n|\r/)
    .filter((l) => l.trim().length > 0 && !l.startsWith('#'))
    .slice(0, 30);
  if (lines.length > 1 && !/(\r\n|\n|\r)$/.test(sample)) lines.pop(); // the sample may end mid-line
  let best: CsvDelimiter = ',';
  let bestScore = -1;
  for (const d of CSV_DELIMITERS) {
    const headerFields = lines.length > 0 ? countFields(lines[0], d) : 1;
    if (headerFields < 2) continue;
    let score = 0;
    for (const l of lines) if (countFields(l, d) === headerFields) score++;
    if (score > bestScore) {
      best = d;
      bestScore = score;
    }
  }
  let decimalComma = false;
  if (best !== ',') {
    const commaNumber = /^\s*-?\d+,\d+\s*$/;
    const pointNumber = /^\s*-?\d+\.\d+\s*$/;
    let commas = 0;
    let points = 0;
    for (const l of lines.slice(1)) {
      for (const f of l.split(best)) {
        if (commaNumber.test(f)) commas++;
        else if (pointNumber.test(f)) points++;
      }
    }
    decimalComma = commas > points;
  }
  return { delimiter: best, decimalComma, newline };
}
