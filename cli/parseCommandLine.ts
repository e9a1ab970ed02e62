// Strict option parsing on node:util parseArgs: unknown options and missing values are usage errors.
import { parseArgs, type ParseArgsConfig } from 'node:util';
import { UsageError } from './usageError.js';

export type OptionSpec = NonNullable<ParseArgsConfig['options']>;

const COMMON = {
  help: { type: 'boolean', short: 'h' },
  quiet: { type: 'boolean', short: 'q' },
  debug: { type: 'boolean' },
} as const;

/** Parsed values: a string for each string option given, true for each flag given. */
export interface ParsedCommandLine<T extends OptionSpec> {
  values: { [K in keyof T]?: T[K] extends { type: 'boolean' } ? boolean : string } & { help?: boolean; quiet?: boolean; debug?: boolean };
  positionals: string[];
}

/** Parses args for `command`; --help, --quiet and --debug are accepted everywhere. */
export function parseCommandLine<T extends OptionSpec>(command: string, args: string[], options: T): ParsedCommandLine<T> {
  try {
    const r = parseArgs({ args, options: { ...options, ...COMMON }, allowPositionals: true, strict: true });
    return { values: r.values as ParsedCommandLine<T>['values'], positionals: r.positionals };
  } catch (err) {
    throw new UsageError(command, (err as Error).message.split('\n')[0]);
  }
}
