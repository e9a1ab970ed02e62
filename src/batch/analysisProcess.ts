// One analysis worker of a batch as a child process: started from a module (built .js, or .ts behind the
// sources' loader), spoken to over the IPC channel with structured-clone messages (NaN and typed arrays
// survive), and told apart from a crash by its exit.
//
// A process rather than a worker thread, because V8's flags are per process: when every processor already
// runs a worker, V8's concurrent compiler threads only compete with the workers for the processors, and a
// compile done on a helper thread costs more processor time in all than the same compile done in line. Measured
// here (2 processors, 24 one-hour 10 Hz flights, --jobs 2): worker threads 7.9 s; processes with in-line
// compiles 6.5 s; jobs 1 8.9 s. A worker thread cannot be given its own V8 flags (Node worker_threads docs,
// "execArgv": V8 options are process-wide), and changing them at run time with v8.setFlagsFromString stopped
// V8 with a failed check here.
import { fork, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { sourceLoaderImportUrl } from './sourceLoader.js';

/** V8 flag that compiles optimised code on the worker's own thread (V8 flag list, `node --v8-options`). */
export const IN_LINE_COMPILE_FLAG = '--no-concurrent-recompilation';

/** Most characters of a child's error output kept to explain its crash. */
const STDERR_KEPT = 16_384;

/** A running analysis process. */
export interface AnalysisProcess {
  send(message: unknown): void;
  /** Asks the process to stop (SIGTERM); its `exit` event follows. */
  stop(): void;
  /** Settles when the process has ended and been reaped. */
  readonly ended: Promise<void>;
}

/** What the pool hears from one analysis process. */
export interface AnalysisProcessEvents {
  message(message: unknown): void;
  /** The process has ended (asked to or not); `why` names the cause when it was not a clean exit. */
  exit(why: string | undefined): void;
}

/** The first line of a child's error output that says what went wrong (an Error line, or V8's fatal line). */
export function crashLine(stderrText: string): string | undefined {
  const lines = stderrText.split(/\r?\n/).map((l) => l.trim()).filter((l) => l !== '');
  return lines.find((l) => /^(FATAL ERROR|[A-Za-z]*Error\b)/.test(l)) ?? lines[lines.length - 1];
}

/**
 * Starts `entry` (a module that serves `process.on('message')` and answers with `process.send`) as a child
 * process. `inLineCompile` adds IN_LINE_COMPILE_FLAG. The child's error output is kept (up to 16 kB) to
 * name the cause of a crash; its standard output is discarded.
 */
export function startAnalysisProcess(entry: URL, inLineCompile: boolean, on: AnalysisProcessEvents): AnalysisProcess {
  const execArgv = [...(inLineCompile ? [IN_LINE_COMPILE_FLAG] : []), ...(entry.pathname.endsWith('.ts') ? ['--import', sourceLoaderImportUrl()] : [])];
  const child: ChildProcess = fork(fileURLToPath(entry), [], { execArgv, serialization: 'advanced', stdio: ['ignore', 'ignore', 'pipe', 'ipc'] });
  let stderrText = '';
  child.stderr?.setEncoding('utf8');
  child.stderr?.on('data', (t: string) => {
    if (stderrText.length < STDERR_KEPT) stderrText += t;
  });
  let ended = false;
  let stopping = false;
  let settle = () => {};
  const endedPromise = new Promise<void>((resolve) => (settle = resolve));
  const end = (why: string | undefined) => {
    if (ended) return;
    ended = true;
    settle();
    on.exit(why);
  };
  child.on('message', (m) => on.message(m));
  child.on('error', (err) => {
    end(`the analysis worker could not run: ${err.message.split('\n')[0]}`);
  });
  // 'close' comes after the error output has been read to its end.
  child.on('close', (code, signal) => {
    if (stopping && (code === 0 || signal === 'SIGTERM')) end(undefined);
    else {
      const line = crashLine(stderrText);
      end(line !== undefined ? `the analysis worker stopped: ${line}` : `the analysis worker exited (${signal !== null ? `signal ${signal}` : `code ${code}`})`);
    }
  });
  return {
    send(message: unknown) {
      if (!ended && child.connected) child.send(message as never);
    },
    stop() {
      stopping = true;
      if (!ended) child.kill('SIGTERM');
    },
    ended: endedPromise,
  };
}
