// run(argv, io) → exit code. The only place that maps errors to exit codes; only cli/main.ts exits.
import { InputError, OptionError } from '../src/errors.js';
import type { CliIo } from './cliIo.js';
import { USAGE } from './usage.js';
import { UsageError } from './usageError.js';

type Command = (args: string[], io: CliIo) => Promise<number>;

// Each command's modules are loaded when it runs, so `--help` or `field` does not load the whole pipeline,
// the report template code and the catalogue's SQLite binding first (about 0.2 s of module loading).
const COMMANDS: Record<string, () => Promise<Command>> = {
  report: async () => (await import('./reportCommand.js')).reportCommand,
  swing: async () => (await import('./swingCommand.js')).swingCommand,
  field: async () => (await import('./fieldCommand.js')).fieldCommand,
  demo: async () => (await import('./demoCommand.js')).demoCommand,
  batch: async () => (await import('./batchCommand.js')).batchCommand,
};

/** Runs one command line (without the node and script words) and returns the exit code. */
export async function run(argv: string[], io: CliIo): Promise<number> {
  const debug = argv.includes('--debug');
  const [name, ...rest] = argv;
  if (name === undefined || name === '-h' || name === '--help' || name === 'help') {
    io.stdout(USAGE.main);
    return name === undefined ? 2 : 0;
  }
  if (name === '--version' || name === '-V') {
    io.stdout('compass-debrief 0.1.0\n');
    return 0;
  }
  const load = Object.hasOwn(COMMANDS, name) ? COMMANDS[name] : undefined;
  if (!load) {
    io.stderr(`compass-debrief: unknown command '${name}'\n\n${USAGE.main}`);
    return 2;
  }
  try {
    const command = await load();
    return await command(rest, io);
  } catch (err) {
    if (err instanceof UsageError) {
      io.stderr(`compass-debrief ${err.command}: ${err.message}\n\n${USAGE[err.command] ?? USAGE.main}`);
      return 2;
    }
    if (err instanceof OptionError) {
      io.stderr(`compass-debrief ${name}: ${err.message}\n`);
      if (debug) io.stderr(`${err.stack}\n`);
      return 2;
    }
    if (err instanceof InputError) {
      io.stderr(`${err.oneLine()}\n`);
      if (debug) io.stderr(`${err.stack}\n`);
      return 1;
    }
    const e = err as NodeJS.ErrnoException;
    io.stderr(`compass-debrief ${name}: ${e?.message ?? String(err)}${debug ? '' : ' (run again with --debug for details)'}\n`);
    if (debug && e?.stack) io.stderr(`${e.stack}\n`);
    return 1;
  }
}
