// Invented training scenarios: the scripts behind the committed samples, and a long flight for the bench.
// Places, pilots and aircraft are invented; coordinates are open countryside chosen for their field.
import { KT_MS, FT_M } from '../constants.js';
import { wrap360 } from '../geo/angles.js';
import type { FlightScript, ScriptLeg } from './flightScript.js';
import type { CsvWriteOptions } from './writeCsv.js';
import type { GpsNoiseOptions } from './gpsNoise.js';
import { legDurationS, planLeg } from './legPlan.js';
import { mulberry32 } from './seededRandom.js';
import type { PilotScript } from './scriptedPilot.js';

/** The fictional "Harrowgate Fen Airstrip" (invented; open fenland), runway 25. */
export const HARROWGATE_FEN = { latDeg: 52.612, lonDeg: 0.387, elevationM: 5 } as const;

/**
 * Variation (east +) a pilot would take from the chart for each scenario: the WMM2025 declination at the
 * start point and date, rounded to 0.1° (computed with geomagnetism 0.2.0; checked in test/synth).
 */
export const SCENARIO_VARIATION_DEG = { circuit: 1.2, navex: 24.7, equator: 2.5 } as const;

const kt = (v: number): number => v * KT_MS;
const ft = (v: number): number => v * FT_M;

/** A true heading from a magnetic one and the variation (east +): true = magnetic + variation. */
function trueOf(magDeg: number, variationDeg: number): number {
  return wrap360(magDeg + variationDeg);
}

/** Magnetic heading back toward the strip at the end of the circuit lesson (bearing from the orbit's end). */
const CIRCUIT_HOMEBOUND_MAG_DEG = 95;
/** Length of the homebound leg [s], ending about a mile from the strip. */
const CIRCUIT_HOMEBOUND_S = 110;

/**
 * "Circuit practice" at Harrowgate Fen Airstrip, 2026-05-04 10:00Z, 1 Hz, wind 250/15 kt, about 26 min:
 * climb-out on runway 25 to 2000 ft, compass turns at standard rate to magnetic cardinal headings (90° and
 * 180°, through north and through south), two timed turns, speed changes on east and west headings, a
 * left orbit for the wind, and a descent back toward the strip. Turn targets are magnetic (variation 1.2 E).
 */
export function circuitPracticeScript(): FlightScript {
  const v = SCENARIO_VARIATION_DEG.circuit;
  const to = (mag: number, direction: 'left' | 'right', label: string): ScriptLeg => ({
    kind: 'turn', direction, toHeadingDegTrue: trueOf(mag, v), label,
  });
  const settle = (s = 20): ScriptLeg => ({ kind: 'straight', durationS: s });
  const speedSet = (heading: string): ScriptLeg[] => [
    { kind: 'speed', toTasMs: kt(115), accelMs2: 0.6, label: `accelerate on ${heading}` },
    settle(20),
    { kind: 'speed', toTasMs: kt(80), accelMs2: 0.6, label: `decelerate on ${heading}` },
    settle(20),
    { kind: 'speed', toTasMs: kt(95), accelMs2: 0.5, label: `back to cruise on ${heading}` },
    settle(25),
  ];
  return {
    name: 'Circuit practice, Harrowgate Fen Airstrip',
    start: {
      t0: Date.UTC(2026, 4, 4, 10, 0, 0) / 1000,
      latDeg: HARROWGATE_FEN.latDeg,
      lonDeg: HARROWGATE_FEN.lonDeg,
      altM: HARROWGATE_FEN.elevationM + 25,
      headingDegTrue: 250,
      tasMs: kt(70),
    },
    wind: { fromDegTrue: 250, speedMs: kt(15) },
    sampleRateHz: 1,
    legs: [
      { kind: 'climb', toAltM: ft(2000), rateMs: 3.5, label: 'climb-out, runway 25' },
      { kind: 'speed', toTasMs: kt(95), accelMs2: 0.5, label: 'accelerate to cruise' },
      to(0, 'right', 'turn onto north'),
      settle(40),
      to(90, 'right', 'compass turn: north to east'),
      settle(),
      to(270, 'right', 'compass turn: east to west through south'),
      settle(),
      to(90, 'right', 'compass turn: west to east through north'),
      settle(),
      to(0, 'left', 'compass turn: east onto north'),
      settle(),
      to(180, 'left', 'compass turn: north to south through west'),
      settle(),
      to(270, 'right', 'compass turn: south to west'),
      settle(),
      to(180, 'left', 'compass turn: west onto south'),
      settle(),
      { kind: 'turn', direction: 'right', durationS: 30, label: 'timed turn: 30 s right (90°)' },
      settle(),
      { kind: 'turn', direction: 'left', durationS: 60, label: 'timed turn: 60 s left (180°)' },
      settle(),
      ...speedSet('east'),
      to(270, 'right', 'turn onto west through south'),
      settle(),
      ...speedSet('west'),
      { kind: 'orbit', direction: 'left', label: 'orbit for the wind' },
      settle(20),
      { kind: 'climb', toAltM: ft(1000), rateMs: 2.5, label: 'descend to circuit height' },
      to(CIRCUIT_HOMEBOUND_MAG_DEG, 'right', 'turn for home'),
      { kind: 'straight', durationS: CIRCUIT_HOMEBOUND_S, label: 'back toward the strip' },
    ],
  };
}


/**
 * "Southern navigation exercise" over the Canterbury plains (open farmland; departure strip invented),
 * 2026-03-12 21:30Z, 1 Hz, wind veering and freshening with height (300/12 kt at 500 m, 320/22 kt at
 * 1500 m), about 45 min: climb to 3500 ft, a 15-minute straight leg, then turns through west, north, east
 * and south on magnetic headings (variation 24.7 E), descent. Southern magnetic hemisphere (dip ≈ −69°).
 */
export function southernNavexScript(): FlightScript {
  const v = SCENARIO_VARIATION_DEG.navex;
  const to = (mag: number, direction: 'left' | 'right', label: string): ScriptLeg => ({
    kind: 'turn', direction, toHeadingDegTrue: trueOf(mag, v), label,
  });
  return {
    name: 'Southern navigation exercise',
    start: {
      t0: Date.UTC(2026, 2, 12, 21, 30, 0) / 1000,
      latDeg: -43.75,
      lonDeg: 171.95,
      altM: 200,
      headingDegTrue: trueOf(200, v),
      tasMs: kt(85),
    },
    wind: {
      table: [
        { altM: 500, fromDegTrue: 300, speedMs: kt(12) },
        { altM: 1500, fromDegTrue: 320, speedMs: kt(22) },
      ],
    },
    sampleRateHz: 1,
    legs: [
      { kind: 'climb', toAltM: ft(3500), rateMs: 3, label: 'climb on the first heading' },
      { kind: 'speed', toTasMs: kt(110), accelMs2: 0.4, label: 'accelerate to cruise' },
      { kind: 'straight', durationS: 900, label: 'long leg, 200 magnetic' },
      to(335, 'right', 'turn through west onto 335'),
      { kind: 'straight', durationS: 240, label: 'leg 335' },
      to(0, 'right', 'turn onto north'),
      { kind: 'straight', durationS: 120, label: 'leg 000' },
      to(90, 'right', 'turn onto east'),
      { kind: 'straight', durationS: 180, label: 'leg 090' },
      to(180, 'right', 'turn onto south'),
      { kind: 'straight', durationS: 240, label: 'leg 180' },
      to(45, 'left', 'turn through east onto 045'),
      { kind: 'straight', durationS: 300, label: 'leg 045' },
      { kind: 'climb', toAltM: 300, rateMs: 2.5, label: 'descent' },
      { kind: 'straight', durationS: 30 },
    ],
  };
}

/**
 * "Equator turns": a short flight near the magnetic (dip) equator (10.4 N 20.0 E, open savanna; WMM2025
 * dip ≈ −0.1° there), 2026-01-15 08:00Z, 1 Hz, wind 060/10 kt, about 12 min: 90° standard-rate turns through
 * all four cardinal headings, 30° banked turns through north and south, speed changes on east and west.
 * With no vertical field the turning and acceleration errors vanish: the compass should read true.
 */
export function equatorTurnsScript(): FlightScript {
  const v = SCENARIO_VARIATION_DEG.equator;
  const to = (mag: number, direction: 'left' | 'right', label: string, bankDeg?: number): ScriptLeg => ({
    kind: 'turn', direction, toHeadingDegTrue: trueOf(mag, v), label, ...(bankDeg !== undefined ? { bankDeg } : {}),
  });
  const leg = (s: number): ScriptLeg => ({ kind: 'straight', durationS: s });
  return {
    name: 'Equator turns',
    start: { t0: Date.UTC(2026, 0, 15, 8, 0, 0) / 1000, latDeg: 10.4, lonDeg: 20.0, altM: 900, headingDegTrue: trueOf(0, v), tasMs: kt(100) },
    wind: { fromDegTrue: 60, speedMs: kt(10) },
    sampleRateHz: 1,
    legs: [
      leg(30),
      to(90, 'right', 'north to east'),
      leg(20),
      { kind: 'speed', toTasMs: kt(120), accelMs2: 0.6, label: 'accelerate on east' },
      leg(15),
      { kind: 'speed', toTasMs: kt(100), accelMs2: 0.6, label: 'decelerate on east' },
      leg(20),
      to(180, 'right', 'east to south'),
      leg(20),
      to(270, 'right', 'south to west'),
      leg(20),
      { kind: 'speed', toTasMs: kt(120), accelMs2: 0.6, label: 'accelerate on west' },
      leg(15),
      { kind: 'speed', toTasMs: kt(100), accelMs2: 0.6, label: 'decelerate on west' },
      leg(20),
      to(0, 'right', 'west to north'),
      leg(20),
      to(180, 'left', 'north to south through west, 30° bank', 30),
      leg(20),
      to(0, 'left', 'south to north through east, 30° bank', 30),
      leg(30),
    ],
  };
}

/** One committed sample: its file, the script, the GPS noise and the writer options. */
export interface SampleSpec {
  file: string;
  format: 'gpx' | 'csv';
  script: () => FlightScript;
  noise: Omit<GpsNoiseOptions, 'file' | 'format'>;
  csv?: CsvWriteOptions;
}

/** The samples under samples/, in the order makeSamples writes them. */
export const SAMPLE_SPECS: readonly SampleSpec[] = [
  {
    file: 'circuit-practice.gpx',
    format: 'gpx',
    script: circuitPracticeScript,
    noise: {
      posSigmaM: 2, altSigmaM: 3, seed: 20260504,
      meta: {
        name: 'Circuit practice, Harrowgate Fen Airstrip',
        pilot: 'P. Okonkwo-Lindqvist',
        aircraft: 'Fenbird 2',
        device: 'synthetic log (compass-debrief synth)',
        comment: 'Invented training flight: compass turns, timed turns, speed changes, orbit. Wind 250/15 kt.',
      },
    },
  },
  {
    file: 'southern-navex.csv',
    format: 'csv',
    script: southernNavexScript,
    noise: {
      posSigmaM: 2.5, altSigmaM: 4, seed: 20260313, velocity: { sigmaMs: 0.15 },
      meta: { name: 'Southern navigation exercise', pilot: 'M. Tawhiri-Kowalczyk', aircraft: 'Plover 4', device: 'synthetic log' },
    },
    csv: { altUnit: 'ft', velocity: true },
  },
  {
    file: 'equator-turns.gpx',
    format: 'gpx',
    script: equatorTurnsScript,
    noise: {
      posSigmaM: 2, altSigmaM: 3, seed: 20260115,
      meta: {
        name: 'Equator turns',
        pilot: 'A. Nwachukwu-Haldane',
        aircraft: 'Sandgrouse 1',
        device: 'synthetic log (compass-debrief synth)',
        comment: 'Invented flight near the magnetic equator: turning and acceleration errors should vanish.',
      },
    },
  },
];

/**
 * A long varied flight for the bench: `hours` (default 3) at `hz` (default 10) with exactly
 * round(hours·3600·hz) samples (the last leg is trimmed so the last sample ends the flight). Seeded, so
 * the same arguments give the same script: straights, turns of 15–300° at 1.5–4 °/s or 10–30° bank,
 * orbits, speed changes between 45 and 65 m/s and climbs/descents between 500 and 2500 m, in a wind that
 * veers and freshens with height. Starts over Harrowgate Fen Airstrip at 1000 m.
 */
export function benchFlight(hours = 3, hz = 10): FlightScript {
  const samples = Math.round(hours * 3600 * hz);
  const totalS = (samples - 1) / hz;
  const u = mulberry32(0xbe7c4);
  const pick = (a: number, b: number): number => a + (b - a) * u();
  const start = { t0: Date.UTC(2026, 5, 1, 9, 0, 0) / 1000, latDeg: HARROWGATE_FEN.latDeg, lonDeg: HARROWGATE_FEN.lonDeg, altM: 1000, headingDegTrue: 90, tasMs: 55 };
  const st = { headingDegTrue: start.headingDegTrue, tasMs: start.tasMs, altM: start.altM };
  const legs: ScriptLeg[] = [];
  let used = 0;
  const push = (leg: ScriptLeg): boolean => {
    const p = planLeg(leg, st, 'bench');
    const d = legDurationS(p);
    if (used + d > totalS - 30) return false;
    legs.push(leg);
    used += d;
    if (leg.kind === 'speed') st.tasMs = leg.toTasMs;
    if (leg.kind === 'climb') st.altM = leg.toAltM;
    if (leg.kind === 'turn') st.headingDegTrue = wrap360(st.headingDegTrue + Math.sign(p.amp) * (leg.byDeg ?? 0));
    return true;
  };
  for (;;) {
    const r = u();
    const direction = u() < 0.5 ? 'left' : 'right';
    const style = u() < 0.7 ? { rateDps: pick(1.5, 4) } : { bankDeg: pick(10, 30) };
    let leg: ScriptLeg;
    if (r < 0.35) leg = { kind: 'straight', durationS: Math.round(pick(20, 180)) };
    else if (r < 0.7) leg = { kind: 'turn', direction, byDeg: Math.round(pick(15, 300)), ...style };
    else if (r < 0.78) leg = { kind: 'orbit', direction, ...style };
    else if (r < 0.89) leg = { kind: 'speed', toTasMs: pick(45, 65), accelMs2: pick(0.3, 0.9) };
    else leg = { kind: 'climb', toAltM: Math.round(pick(500, 2500)), rateMs: pick(2, 5) };
    if (!push(leg)) break;
  }
  legs.push({ kind: 'straight', durationS: totalS - used });
  return {
    name: `Bench flight, ${hours} h at ${hz} Hz`,
    start,
    wind: { table: [{ altM: 0, fromDegTrue: 230, speedMs: 5 }, { altM: 1500, fromDegTrue: 260, speedMs: 12 }, { altM: 3000, fromDegTrue: 280, speedMs: 20 }] },
    sampleRateHz: hz,
    legs,
  };
}

/**
 * A compass-turn lesson for a scripted pilot (src/synth/scriptedPilot.ts) at Harrowgate Fen Airstrip,
 * 2026-05-04 11:00Z, 10 Hz (decisions on the card every 0.1 s), 2000 ft, 95 kt, wind 250/15 kt: standard-rate
 * compass turns onto magnetic north and south from east and west, both ways, onto east and west, and one
 * beyond 180°, with 20 s straights between them. Fly it with each RolloutTechnique to compare the roll-outs.
 */
export function compassTurnLessonScript(): PilotScript {
  const v = SCENARIO_VARIATION_DEG.circuit;
  const turn = (toMagDeg: number, direction: 'left' | 'right', label: string): PilotScript['legs'][number] => ({
    kind: 'compass-turn', toMagDeg, direction, label,
  });
  const settle = { kind: 'straight', durationS: 20 } as const;
  return {
    name: 'Compass-turn lesson, Harrowgate Fen Airstrip',
    start: {
      t0: Date.UTC(2026, 4, 4, 11, 0, 0) / 1000,
      latDeg: HARROWGATE_FEN.latDeg,
      lonDeg: HARROWGATE_FEN.lonDeg,
      altM: ft(2000),
      headingDegTrue: trueOf(90, v),
      tasMs: kt(95),
    },
    wind: { fromDegTrue: 250, speedMs: kt(15) },
    sampleRateHz: 10,
    legs: [
      settle,
      turn(0, 'left', 'east onto north, left'),
      settle,
      turn(90, 'right', 'north onto east, right'),
      settle,
      turn(180, 'right', 'east onto south, right'),
      settle,
      turn(270, 'right', 'south onto west, right'),
      settle,
      turn(0, 'right', 'west onto north, right'),
      settle,
      turn(270, 'left', 'north onto west, left'),
      settle,
      turn(180, 'left', 'west onto south, left'),
      settle,
      turn(0, 'left', 'south onto north through east, left'),
      settle,
    ],
  };
}
