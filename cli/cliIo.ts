// The CLI's view of the outside world, injected so that tests can run commands without a process.
export interface CliIo {
  stdout: (text: string) => void;
  stderr: (text: string) => void;
  /** True when stderr is a terminal: progress and colour only then. */
  isTty: boolean;
  env: Record<string, string | undefined>;
  cwd: string;
}

/** The real process's io. */
export function processIo(): CliIo {
  return {
    stdout: (t) => process.stdout.write(t),
    stderr: (t) => process.stderr.write(t),
    isTty: Boolean(process.stderr.isTTY),
    env: process.env,
    cwd: process.cwd(),
  };
}

/** Colour is used only on a terminal and never when NO_COLOR is set (no-color.org). */
export function useColour(io: CliIo): boolean {
  return io.isTty && !(io.env.NO_COLOR !== undefined && io.env.NO_COLOR !== '');
}
