// A synthetic FlightAnalysis for the report tests: typed columns filled from closed-form formulas.
// Invented scenario: circuits and compass turns near the fictional "Harrowgate Fen Airstrip".
// Not a physics oracle: the report only has to draw whatever the pipeline gives it.
import { DEFAULT_COMPASS_PROFILE } from '../../src/compass/compassProfile.js';
import { DEG, G0_MS2, KT_MS, RAD } from '../../src/constants.js';
import { wrap180, wrap360 } from '../../src/geo/angles.js';
import type { FlightAnalysis } from '../../src/flightAnalysis.js';
import type { DivergenceWindow, ExcursionResult, SpeedEpisode, TurnResult } from '../../src/analysis/analysisTypes.js';
import type { LogMeta, LogWarning } from '../../src/log/flightLog.js';

/** Strings that try to break out of HTML text, attributes, the JSON block and the template. */
export const HOSTILE = {
  name: '<script>alert(1)</script>',
  aircraft: '" onmouseover="x',
  pilot: "P. Okonkwo-Lindqvist</script><script>alert('pilot')</script>",
  comment: "it's <b>bold</b> & {{CSP}} $& $' `${x}` <!-- <script>",
  file: 'fen-circuits</script><img src=x onerror=alert(3)>.gpx',
  warning: '<img src=x onerror=alert(4)> record had "quotes" & </script>',
};

export interface SyntheticOptions {
  /** Flight length [s]. */
  durationS: number;
  /** Sample rate [Hz]. */
  hz: number;
  /** Put the HOSTILE strings in the log's name, meta, file and a warning. */
  hostile?: boolean;
  /** Include analysis results (turns, episodes, divergences); false leaves the lists empty. */
  withEvents?: boolean;
  /** Start of the flight [UTC s]. Default 2026-05-04T09:30:00Z. */
  t0Utc?: number;
}

interface Leg {
  durS: number;
  rateDps: number;
  accelKtS: number;
}

/** A repeating pattern of straight legs, standard-rate turns and speed changes. */
const PATTERN: Leg[] = [
  { durS: 240, rateDps: 0, accelKtS: 0 },
  { durS: 30, rateDps: 3, accelKtS: 0 },
  { durS: 60, rateDps: 0, accelKtS: 0 },
  { durS: 15, rateDps: 0, accelKtS: 1.2 },
  { durS: 150, rateDps: 0, accelKtS: 0 },
  { durS: 60, rateDps: -3, accelKtS: 0 },
  { durS: 120, rateDps: 0, accelKtS: 0 },
  { durS: 15, rateDps: 0, accelKtS: -1.2 },
  { durS: 300, rateDps: 0, accelKtS: 0 },
  { durS: 45, rateDps: 3, accelKtS: 0 },
  { durS: 200, rateDps: 0, accelKtS: 0 },
  { durS: 120, rateDps: -3, accelKtS: 0 },
  { durS: 90, rateDps: 0, accelKtS: 0 },
  { durS: 40, rateDps: 3, accelKtS: 0 },
];

const AIRSTRIP = { latDeg: 52.6183, lonDeg: 0.2417 }; // invented position of the fictional airstrip
const DIP_DEG = 66.8;
const WIND = { fromDeg: 250, speedKt: 15 };

/**
 * Builds a FlightAnalysis whose columns come from formulas: heading from the turn schedule, bank from
 * tan φ = Vω/g, the static card reading from the level-turn relation
 * tan ψc = (sin ψm cos φ − tan μ sin φ) / cos ψm (PHYSICS.md §1.2) plus the first-order acceleration
 * term −tan μ (a/g) sin ψm, a first-order lag for the dynamic card, and 2° sin h of deviation.
 */
export function syntheticFlight(opts: SyntheticOptions): FlightAnalysis {
  const dt = 1 / opts.hz;
  const t0 = opts.t0Utc ?? Date.UTC(2026, 4, 4, 9, 30, 0) / 1000;
  const nPlanned = Math.round(opts.durationS * opts.hz);
  const gapAt = Math.floor(nPlanned * 0.4);
  const gapS = 25;
  const n = nPlanned;
  const col = () => new Float64Array(n);
  const t = col(), lat = col(), lon = col(), altM = col();
  const velN = col(), velE = col(), velD = col(), accN = col(), accE = col(), accD = col(), accSigma = col();
  const gs = col(), track = col(), windN = col(), windE = col(), tas = col(), hdgTrue = col();
  const bank = col(), pitch = col(), rate = col(), accLong = col();
  const segment = new Int32Array(n), logRow = new Int32Array(n);
  const variation = col(), dip = col(), xNt = col(), yNt = col(), zNt = col(), hNt = col();
  const staticDeg = col(), dynamicDeg = col(), readingDeg = col(), errorDeg = col();
  const eTurn = col(), eAccel = col(), eLag = col(), eDev = col(), tilt = col(), directive = col();
  const unreliable = new Uint8Array(n);
  const legIndex = new Int32Array(n);

  const wN = -WIND.speedKt * KT_MS * Math.cos(WIND.fromDeg * DEG);
  const wE = -WIND.speedKt * KT_MS * Math.sin(WIND.fromDeg * DEG);
  let headingDeg = 20;
  let tasMs = 95 * KT_MS;
  let north = 0, east = 0;
  let leg = 0, legT = 0;
  let dyn = NaN;
  const R = 6371000;
  for (let i = 0; i < n; i++) {
    const L = PATTERN[leg % PATTERN.length];
    legIndex[i] = leg;
    t[i] = t0 + i * dt + (i >= gapAt ? gapS : 0);
    segment[i] = i >= gapAt ? 1 : 0;
    logRow[i] = i;
    const omegaDps = L.rateDps;
    const aMs2 = L.accelKtS * KT_MS;
    headingDeg = wrap360(headingDeg + omegaDps * dt);
    tasMs += aMs2 * dt;
    const vaN = tasMs * Math.cos(headingDeg * DEG), vaE = tasMs * Math.sin(headingDeg * DEG);
    velN[i] = vaN + wN; velE[i] = vaE + wE; velD[i] = 0;
    north += velN[i] * dt; east += velE[i] * dt;
    lat[i] = AIRSTRIP.latDeg + (north / R) * RAD;
    lon[i] = AIRSTRIP.lonDeg + (east / (R * Math.cos(AIRSTRIP.latDeg * DEG))) * RAD;
    altM[i] = 600 + 30 * Math.sin((2 * Math.PI * i * dt) / 600);
    gs[i] = Math.hypot(velN[i], velE[i]);
    track[i] = wrap360(Math.atan2(velE[i], velN[i]) * RAD);
    windN[i] = wN; windE[i] = wE; tas[i] = tasMs; hdgTrue[i] = headingDeg;
    bank[i] = Math.atan((tasMs * omegaDps * DEG) / G0_MS2) * RAD;
    pitch[i] = 2; rate[i] = omegaDps; accLong[i] = aMs2;
    accN[i] = 0; accE[i] = 0; accD[i] = 0; accSigma[i] = 0.05;

    variation[i] = -0.4 + 0.002 * (east / 1852);
    dip[i] = DIP_DEG + 0.001 * (north / 1852);
    hNt[i] = 18500; xNt[i] = 18500 * Math.cos(variation[i] * DEG); yNt[i] = 18500 * Math.sin(variation[i] * DEG);
    zNt[i] = 18500 * Math.tan(dip[i] * DEG);

    const mag = wrap360(headingDeg - variation[i]);
    const psi = mag * DEG, phi = bank[i] * DEG, tanMu = Math.tan(dip[i] * DEG);
    const staticTurn = Math.atan2(Math.sin(psi) * Math.cos(phi) - tanMu * Math.sin(phi), Math.cos(psi)) * RAD;
    const turnErr = wrap180(staticTurn - mag);
    const accelErr = -tanMu * (aMs2 / G0_MS2) * Math.sin(psi) * RAD;
    staticDeg[i] = wrap360(mag + turnErr + accelErr);
    dyn = Number.isFinite(dyn) ? dyn + (dt / 2.5) * wrap180(staticDeg[i] - dyn) : staticDeg[i];
    if (i === gapAt) dyn = staticDeg[i];
    dyn = wrap360(dyn);
    dynamicDeg[i] = dyn;
    eDev[i] = 2 * Math.sin(dyn * DEG);
    readingDeg[i] = wrap360(dyn + eDev[i]);
    eTurn[i] = turnErr; eAccel[i] = accelErr;
    eLag[i] = wrap180(dyn - staticDeg[i]);
    errorDeg[i] = wrap180(readingDeg[i] - mag);
    tilt[i] = 0;
    directive[i] = Math.cos(phi);
    unreliable[i] = Math.abs(errorDeg[i]) > 32 ? 1 : 0;

    legT += dt;
    if (legT >= L.durS - 1e-9) {
      leg++;
      legT = 0;
    }
  }

  const turns: TurnResult[] = [];
  const episodes: SpeedEpisode[] = [];
  if (opts.withEvents !== false) {
    let i = 0;
    while (i < n) {
      let j = i;
      while (j + 1 < n && legIndex[j + 1] === legIndex[i]) j++;
      const L = PATTERN[legIndex[i] % PATTERN.length];
      const magAt = (k: number) => wrap360(hdgTrue[k] - variation[k]);
      if (L.rateDps !== 0 && turns.length < 40) {
        turns.push({
          startIndex: i, endIndex: j, startT: t[i], endT: t[j], direction: L.rateDps > 0 ? 'right' : 'left',
          headingChangeDeg: Math.abs(L.rateDps * L.durS), meanRateDps: Math.abs(L.rateDps), peakBankDeg: Math.abs(bank[i]), meanBankDeg: Math.abs(bank[i]),
          entryMagDeg: magAt(i), rolloutMagDeg: magAt(j), compassAtRolloutDeg: readingDeg[j], compassSettledDeg: readingDeg[Math.min(n - 1, j + 10 * opts.hz)],
          targetMagDeg: wrap360(Math.round(magAt(j) / 10) * 10), targetSource: 'inferred', targetConfidence: 0.8,
          rolloutErrorDeg: wrap180(magAt(j) - Math.round(magAt(j) / 10) * 10), withinTolerance: Math.abs(wrap180(magAt(j) - Math.round(magAt(j) / 10) * 10)) <= 5,
          cueCompassDeg: wrap360(readingDeg[j] - 5), ruleOfThumbCueDeg: wrap360(readingDeg[j] - 8),
          compassAtRolloutStartDeg: readingDeg[Math.max(i, j - 3 * opts.hz)], toleranceDeg: 5,
          timed: turns.length % 3 === 0 ? { durationS: L.durS, expectedChangeDeg: 3 * L.durS, actualChangeDeg: 3 * L.durS + 2, differenceDeg: 2, withinTolerance: true } : undefined,
        });
      }
      if (L.accelKtS !== 0 && episodes.length < 40) {
        episodes.push({
          startIndex: i, endIndex: j, startT: t[i], endT: t[j], kind: L.accelKtS > 0 ? 'accelerating' : 'decelerating',
          peakAccelMs2: L.accelKtS * KT_MS, headingMagDeg: magAt(i), peakSwingDeg: eAccel[i], swingDirection: eAccel[i] > 0 ? 'right' : eAccel[i] < 0 ? 'left' : 'none',
          expectedSwingDeg: Math.abs(eAccel[i]),
        });
      }
      i = j + 1;
    }
  }
  const divergences: DivergenceWindow[] = [];
  if (opts.withEvents !== false) {
    let i = 0;
    while (i < n) {
      if (Math.abs(errorDeg[i]) <= 10) { i++; continue; }
      let j = i, peak = i;
      while (j + 1 < n && Math.abs(errorDeg[j + 1]) > 10 && segment[j + 1] === segment[i]) {
        j++;
        if (Math.abs(errorDeg[j]) > Math.abs(errorDeg[peak])) peak = j;
      }
      if (t[j] - t[i] >= 5 && divergences.length < 60) {
        divergences.push({ startIndex: i, endIndex: j, startT: t[i], endT: t[j], peakErrorDeg: errorDeg[peak], peakT: t[peak], cause: 'turn' });
      }
      i = j + 1;
    }
  }

  const excursions: ExcursionResult[] = [];
  if (opts.withEvents !== false) {
    // The first long straight leg, "flown on the compass": the believed track is the real one turned by 6°.
    const legStart = Math.min(n - 1, Math.round(PATTERN[0].durS * 0.25 * opts.hz));
    const legEnd = Math.min(n - 1, Math.round(PATTERN[0].durS * opts.hz) - 1);
    const m = legEnd - legStart + 1;
    if (m > 10) {
      const bLat = new Float64Array(m), bLon = new Float64Array(m);
      const c = Math.cos(6 * DEG), sn = Math.sin(6 * DEG), k = Math.cos(lat[legStart] * DEG);
      for (let q = 0; q < m; q++) {
        const dN = lat[legStart + q] - lat[legStart], dE = (lon[legStart + q] - lon[legStart]) * k;
        bLat[q] = lat[legStart] + c * dN - sn * dE;
        bLon[q] = lon[legStart] + (sn * dN + c * dE) / k;
      }
      excursions.push({
        startIndex: legStart, endIndex: legEnd, startT: t[legStart], endT: t[legEnd], heldCompassDeg: readingDeg[legStart],
        observedCrossTrackM: 820, compassCrossTrackM: 610, windCrossTrackM: 250, residualCrossTrackM: -40, source: 'detected',
        believedTrack: { latDeg: bLat, lonDeg: bLon },
      });
    }
  }

  const meta: LogMeta = opts.hostile
    ? { name: HOSTILE.name, aircraft: HOSTILE.aircraft, pilot: HOSTILE.pilot, comment: HOSTILE.comment, device: 'Fenbird 2 panel logger' }
    : { name: 'Harrowgate Fen circuits', aircraft: 'Fenbird 2', pilot: 'P. Okonkwo-Lindqvist', device: 'panel logger' };
  const warnings: LogWarning[] = [
    { code: 'time-gap', message: `The log stops for ${gapS} s; lines break there.`, lines: [gapAt + 1] },
    { code: 'invalid-altitude', message: 'Two altitudes were not numbers and were left out.', lines: Array.from({ length: 20 }, (_, k) => 100 + k), count: 20 },
  ];
  if (opts.hostile) warnings.push({ code: 'odd-record', message: HOSTILE.warning, lines: [7] });

  return {
    log: {
      source: { format: 'gpx', file: opts.hostile ? HOSTILE.file : 'samples/harrowgate-fen-circuits.gpx', warnings, meta, altDatum: 'msl' },
      t, lat, lon, altM, line: new Int32Array(n).map((_, k) => k + 1),
    },
    profile: DEFAULT_COMPASS_PROFILE,
    health: { recordsRead: n + 22, samplesKept: n, duplicateTimes: 2, outOfOrder: 0, positionSpikes: 1, invalidValues: 20, gaps: 1, truncated: false },
    state: {
      n, t, lat, lon, altM, velN, velE, velD, accN, accE, accD, accSigmaMs2: accSigma, gsMs: gs, trackDegTrue: track,
      windN, windE, tasMs: tas, headingDegTrue: hdgTrue, headingSigmaDeg: new Float64Array(n).fill(1.5), bankDeg: bank, pitchDeg: pitch, turnRateDps: rate, accelLongMs2: accLong,
      segment, logRow,
      winds: [{ fromDegTrue: WIND.fromDeg, speedMs: WIND.speedKt * KT_MS, source: 'given', t0: NaN, t1: NaN, altM: NaN, sigmaMs: NaN, tasMs: NaN, arcDeg: NaN }],
      warnings: [],
    },
    field: { n, xNt, yNt, zNt, hNt, variationDeg: variation, dipDeg: dip, zone: new Uint8Array(n), model: 'WMM2025', decimalYear: 2026.34 },
    compass: {
      n, staticDeg, dynamicDeg, readingDeg, errorDeg, errDipTurnDeg: eTurn, errDipAccelDeg: eAccel, errLagSwirlDeg: eLag, errDeviationDeg: eDev,
      tiltDeg: tilt, directiveRatio: directive, unreliable,
    },
    analysis: { turns, episodes, divergences, excursions },
    warnings,
    timingsMs: {},
  };
}
