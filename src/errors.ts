// Typed errors. Parameters throw these; bad samples become NaN and a warning instead.

/** The input cannot be used. `file` and `line` (or record) locate it; `hint` says what to do. Exit code 1. */
export class InputError extends Error {
  readonly file: string;
  readonly line?: number;
  readonly hint?: string;
  constructor(file: string, message: string, opts: { line?: number; hint?: string } = {}) {
    super(message);
    this.name = 'InputError';
    this.file = file;
    this.line = opts.line;
    this.hint = opts.hint;
  }

  /** One line for stderr: `file:line: what is wrong. what to do`. */
  oneLine(): string {
    const where = this.line !== undefined ? `${this.file}:${this.line}` : this.file;
    return `${where}: ${this.message}${this.hint ? ` (${this.hint})` : ''}`;
  }
}

/** A format reader's complaint before the caller knows the file name; the caller wraps it in an InputError. */
export class ParseError extends Error {
  readonly line?: number;
  readonly hint?: string;
  constructor(message: string, opts: { line?: number; hint?: string } = {}) {
    super(message);
    this.name = 'ParseError';
    this.line = opts.line;
    this.hint = opts.hint;
  }
}

/** A parameter or option outside its allowed range. Names the parameter and the range. Exit code 2 at the CLI. */
export class OptionError extends Error {
  readonly option: string;
  constructor(option: string, message: string) {
    super(`${option}: ${message}`);
    this.name = 'OptionError';
    this.option = option;
  }
}
