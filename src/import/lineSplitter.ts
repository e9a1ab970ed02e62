// Cutting a text that arrives in chunks into lines, with line numbers that run on across chunks.

/**
 * Push text chunks of any size; `visit(line, lineNo)` is called for each complete line (CR LF, LF or
 * CR ends a line; a CR at the very end of a chunk waits for the next one in case an LF follows).
 * `end()` delivers a last line without a line break and tells whether the text ended with one.
 */
export class LineSplitter {
  private rest = '';
  private lineNo = 0;

  constructor(private readonly visit: (line: string, lineNo: number) => void) {}

  push(chunk: string): void {
    const text = this.rest + chunk;
    const n = text.length;
    let start = 0;
    let i = 0;
    while (i < n) {
      const c = text.charCodeAt(i);
      if (c === 10 || c === 13) {
        if (c === 13 && i + 1 === n) break; // maybe CR LF split across chunks
        this.visit(text.slice(start, i), ++this.lineNo);
        i += c === 13 && text.charCodeAt(i + 1) === 10 ? 2 : 1;
        start = i;
      } else i++;
    }
    this.rest = text.slice(start);
  }

  /** Flushes the last line; returns true when the text ended with a line break (or was empty). */
  end(): boolean {
    const rest = this.rest;
    this.rest = '';
    if (rest === '') return true;
    if (rest === '\r') return true;
    this.visit(rest, ++this.lineNo);
    return false;
  }
}
