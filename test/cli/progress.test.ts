// Progress on long work: on a terminal a live line per stage with a percentage after a second; elsewhere a
// note only for stages over a second; nothing with --quiet.
import { afterEach, describe, expect, it, vi } from 'vitest';
import { progressReporter } from '../../cli/progress.js';

function io(isTty: boolean) {
  const out = { text: '' };
  return { out, io: { stdout: () => {}, stderr: (t: string) => (out.text += t), isTty, env: {}, cwd: '.' } };
}

afterEach(() => vi.useRealTimers());

describe('progress', () => {
  it('on a terminal shows the stage, then its percentage once it has run a second, and clears the line', () => {
    vi.useFakeTimers();
    vi.setSystemTime(0);
    const { out, io: tty } = io(true);
    const p = progressReporter(tty, false);
    p.stage('reading the log');
    p.fraction(0.2);
    expect(out.text).toBe('reading the log…'); // under a second: no percentage yet
    vi.setSystemTime(1500);
    p.fraction(0.42);
    expect(out.text).toContain('reading the log… 42 %');
    p.done();
    expect(out.text.endsWith('\r\x1b[2K')).toBe(true);
  });

  it('elsewhere notes only the stages that took over a second, one plain line each', () => {
    vi.useFakeTimers();
    vi.setSystemTime(0);
    const { out, io: pipe } = io(false);
    const p = progressReporter(pipe, false);
    p.stage('quick');
    vi.setSystemTime(200);
    p.stage('slow');
    p.fraction(0.5);
    vi.setSystemTime(2700);
    p.done();
    expect(out.text).toBe('slow: 2.5 s\n');
  });

  it('says nothing when quiet', () => {
    const { out, io: tty } = io(true);
    const p = progressReporter(tty, true);
    p.stage('reading the log');
    p.fraction(0.5);
    p.done();
    expect(out.text).toBe('');
  });
});
