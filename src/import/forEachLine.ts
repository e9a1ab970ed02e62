// Walking the lines of a text without splitting it into an array first.

/**
 * Calls `visit(line, lineNo)` for each line of `text` (1-based numbers; CR LF, LF and lone CR all end a
 * line; the terminator is not part of the line). Returns whether the text ended with a line break
 * (false: the last line may have been cut off). An empty text has no lines.
 */
export function forEachLine(text: string, visit: (line: string, lineNo: number) => void): boolean {
  const n = text.length;
  let start = 0;
  let lineNo = 0;
  while (start < n) {
    let end = start;
    while (end < n) {
      const c = text.charCodeAt(end);
      if (c === 10 || c === 13) break;
      end++;
    }
    lineNo++;
    visit(text.slice(start, end), lineNo);
    if (end >= n) return false;
    start = text.charCodeAt(end) === 13 && text.charCodeAt(end + 1) === 10 ? end + 2 : end + 1;
  }
  return true;
}
