// Speed of the compass stage on a long flight: 108,000 samples (30 h at 1 Hz) of turns and speed changes.
// Run after `npm run build`: node dist/test/compass/simulateCompassBench.js   (prints; asserts nothing)
import { simulateCompass } from '../../src/compass/simulateCompass.js';
import { DEFAULT_COMPASS_PROFILE } from '../../src/compass/compassProfile.js';
import { coordinatedTurnAccel, makeState, uniformField, type Sample } from './compassFixtures.js';

/** A 1 Hz flight of n samples: alternating 60 s straight legs with speed changes and 90° rate-one turns. */
export function benchFlight(n: number): Sample[] {
  const out: Sample[] = [];
  let h = 0;
  for (let i = 0; i < n; i++) {
    const phase = i % 90;
    let bank = 0, rate = 0, aLong = 0;
    if (phase >= 60) { bank = (i / 90) % 2 < 1 ? 15 : -15; rate = Math.sign(bank) * 3; }
    else if (phase >= 20 && phase < 30) aLong = 0.8;
    h += rate;
    const a = coordinatedTurnAccel(h, bank);
    const p = (h * Math.PI) / 180;
    out.push({ t: 1.7e9 + i, headingDegTrue: h, bankDeg: bank, turnRateDps: rate,
      accN: a.accN + aLong * Math.cos(p), accE: a.accE + aLong * Math.sin(p) });
  }
  return out;
}

export function runBench(n = 108_000, repeats = 5): { n: number; bestMs: number; medianMs: number } {
  const s = makeState(benchFlight(n));
  const f = uniformField(n, 19000, 66, 1.5);
  const times: number[] = [];
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    simulateCompass(s, f, DEFAULT_COMPASS_PROFILE, (c) => 1 + 2 * Math.sin((c * Math.PI) / 180));
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return { n, bestMs: times[0], medianMs: times[Math.floor(times.length / 2)] };
}

if (typeof process !== 'undefined' && process.argv[1] && /simulateCompassBench\.(js|ts)$/.test(process.argv[1])) {
  const r = runBench();
  console.log(`simulateCompass: ${r.n} samples at 1 Hz, 20 Hz sub-steps: best ${r.bestMs.toFixed(0)} ms, median ${r.medianMs.toFixed(0)} ms`);
}
