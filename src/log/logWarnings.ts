// Building LogWarnings that point at source lines, with the list of lines capped so a bad log cannot flood the report.
import type { LogWarning } from './flightLog.js';

/** At most this many line numbers are listed in one warning; the rest are only counted. */
export const MAX_WARNING_LINES = 20;

/**
 * Collects the source lines (or record numbers) of one kind of problem: keeps the first
 * MAX_WARNING_LINES of them and counts all. Local state only: make one per parse.
 */
export class LineTally {
  readonly lines: number[] = [];
  count = 0;

  add(line: number): void {
    this.count++;
    if (this.lines.length < MAX_WARNING_LINES && Number.isFinite(line)) this.lines.push(line);
  }
}

function sortedLines(tally: LineTally): number[] {
  return tally.lines.slice().sort((a, b) => a - b);
}

/** "line 7", "lines 7, 9, 12", or "lines 7, 9, … (25 in all)" for a message. `unit` names what the numbers count. */
export function describeLines(tally: LineTally, unit = 'line'): string {
  if (tally.lines.length === 0) return '';
  const list = sortedLines(tally).join(', ');
  if (tally.count === 1) return `${unit} ${list}`;
  const more = tally.count > tally.lines.length ? `, … (${tally.count} in all)` : '';
  return `${unit}s ${list}${more}`;
}

/**
 * A warning for a tally, or undefined when nothing was tallied. `what` is the sentence without the
 * place, e.g. "2 track points have no time and were left out"; the lines are appended in brackets.
 */
export function tallyWarning(code: string, what: string, tally: LineTally, unit = 'line'): LogWarning | undefined {
  if (tally.count === 0) return undefined;
  const where = describeLines(tally, unit);
  return {
    code,
    message: where ? `${what} (${where}).` : `${what}.`,
    lines: sortedLines(tally),
    count: tally.count,
  };
}

/** Appends the warning when there is one. */
export function pushTally(out: LogWarning[], code: string, what: string, tally: LineTally, unit = 'line'): void {
  const w = tallyWarning(code, what, tally, unit);
  if (w) out.push(w);
}

/** "1 track point" / "3 track points". */
export function plural(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}
