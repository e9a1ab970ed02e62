// `demo` writes a debrief for every bundled sample log (side files such as plans and swings are not logs),
// and `swing` reads the bundled swing record.
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { runCli, tempDir } from './runCli.js';

const samplesDir = fileURLToPath(new URL('../../samples/', import.meta.url));

describe('demo', () => {
  it('writes a debrief, samples and summary for each sample log and grades the circuit against its plan', async () => {
    const out = tempDir();
    const r = await runCli(['demo', '--out-dir', out, '--quiet']);
    expect(r.code).toBe(0);
    const logs = readdirSync(samplesDir).filter((f) => /\.(gpx|csv)$/.test(f) && !/\.plan\.csv$|swing/.test(f));
    for (const f of logs) {
      const base = f.replace(/\.[^.]+$/, '');
      expect(readdirSync(out)).toEqual(expect.arrayContaining([`${base}.html`, `${base}-samples.csv`, `${base}-summary.json`]));
    }
    const circuit = JSON.parse(readFileSync(path.join(out, 'circuit-practice-summary.json'), 'utf8'));
    expect(circuit.turns.every((t: { target_source: string }) => t.target_source === 'plan')).toBe(true);
  });
});

describe('swing on the bundled record', () => {
  it('fits the card and keeps every heading within the 10° limit (14 CFR 25.1327(b))', async () => {
    const out = path.join(tempDir(), 'card.json');
    const r = await runCli(['swing', path.join(samplesDir, 'swing-fenbird.csv'), '--json', out]);
    expect(r.code).toBe(0);
    const j = JSON.parse(readFileSync(out, 'utf8'));
    expect(j.over_limit).toEqual([]);
    expect(j.card).toHaveLength(12);
    expect(r.stdout).toMatch(/within the usual 10° limit/);
  });
});
