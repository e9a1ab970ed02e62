// The public API as the README shows it: read a log, analyse it, write the samples and the summary.
import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { analyseFlight, readLogFile, samplesCsv, SAMPLES_CONTRACT_COLUMNS, buildSummary, InputError } from '../src/index.js';
import { KT_MS } from '../src/constants.js';

const sample = fileURLToPath(new URL('../samples/circuit-practice.gpx', import.meta.url));

describe('public API (src/index.ts)', () => {
  it('reads, analyses and summarises the bundled circuit sample as the README example does', async () => {
    const { log, health } = await readLogFile(sample);
    const result = analyseFlight(log, { wind: { kind: 'given', fromDegTrue: 250, speedMs: 15 * KT_MS } }, health);
    expect(result.compass.readingDeg.length).toBe(log.t.length);
    expect(samplesCsv(result).split('\n')[0].startsWith(SAMPLES_CONTRACT_COLUMNS.join(','))).toBe(true);
    const summary = buildSummary(result) as { turns: unknown[]; wind: { source: string } };
    expect(summary.wind.source).toBe('given');
    // samples/README.md: the circuit lesson flies 13 turns (compass turns, timed turns, an orbit, the turn for home).
    expect(summary.turns.length).toBe(13);
  });

  it('throws InputError naming the file for a missing log', async () => {
    await expect(readLogFile('/nonexistent/flight.gpx')).rejects.toBeInstanceOf(InputError);
  });
});
