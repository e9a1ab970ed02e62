// A usage error: the command line itself is wrong. The CLI prints the command's usage and exits 2.
export class UsageError extends Error {
  readonly command: string;
  constructor(command: string, message: string) {
    super(message);
    this.name = 'UsageError';
    this.command = command;
  }
}
