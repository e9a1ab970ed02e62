// Progress on long work: stage names on stderr, only on a terminal (or when a stage runs over a second).
import type { CliIo } from './cliIo.js';

export interface Progress {
  stage(name: string): void;
  /** Share of the current stage done, 0..1 (shown on a terminal once the stage has run a second). */
  fraction(f: number): void;
  done(): void;
}

/** A terminal gets a live line per stage; elsewhere a stage that takes over a second is noted once. */
export function progressReporter(io: CliIo, quiet: boolean): Progress {
  let current = '';
  let started = Date.now();
  const finish = () => {
    if (!current) return;
    const ms = Date.now() - started;
    if (io.isTty) io.stderr(`\r\x1b[2K`);
    else if (ms > 1000) io.stderr(`${current}: ${(ms / 1000).toFixed(1)} s\n`);
  };
  return {
    stage(name: string) {
      if (quiet) return;
      finish();
      current = name;
      started = Date.now();
      if (io.isTty) io.stderr(`${name}…`);
    },
    fraction(f: number) {
      if (quiet || !io.isTty || !current || Date.now() - started < 1000) return;
      io.stderr(`\r\x1b[2K${current}… ${Math.round(Math.max(0, Math.min(1, f)) * 100)} %`);
    },
    done() {
      if (quiet) return;
      finish();
      current = '';
    },
  };
}
