// The pilot-flown sample lesson: the compass-turn lesson flown by a student who rolls out when the
// compass shows the target, decimated to a 1 Hz log, with the plan of intended headings beside it.
import { compassTurnLessonScript } from './scenarios.js';
import { flyScriptedPilot, type RolloutTechnique } from './scriptedPilot.js';
import { decimateTruth } from './decimateTruth.js';
import { isoUtcMs } from './writeGpx.js';
import type { SynthTruth } from './synthTruth.js';
import type { GpsNoiseOptions } from './gpsNoise.js';

export interface StudentLesson {
  truth: SynthTruth;
  /** Plan CSV: the intended magnetic heading of each compass turn, anchored 10 s before its roll-in. */
  planCsv: string;
}

/**
 * Flies compassTurnLessonScript (10 Hz) with the given technique (default: rolls out on the reading, the
 * student's mistake the debrief should show) on the simulated compass, and decimates to 1 Hz. Deterministic.
 */
export function studentLesson(technique: RolloutTechnique = 'rolls-out-on-reading'): StudentLesson {
  const flown = flyScriptedPilot(compassTurnLessonScript(), {
    technique,
    magnetics: { kind: 'wmm2025' },
  });
  const rows = ['target_mag_deg,not_before_utc'];
  for (const t of flown.turns) {
    const leg = flown.truth.legs[t.legIndex];
    rows.push(`${String(Math.round(t.targetMagDeg) % 360).padStart(3, '0')},${isoUtcMs(Math.floor(leg.startT - 10))}`);
  }
  return { truth: decimateTruth(flown.truth, 10), planCsv: `${rows.join('\n')}\n` };
}

/** File name and GPS noise of the committed student sample. */
export const STUDENT_SAMPLE = {
  file: 'compass-turns-student.gpx',
  planFile: 'compass-turns-student.plan.csv',
  noise: {
    posSigmaM: 2, altSigmaM: 3, seed: 20260505,
    meta: {
      name: 'Compass-turn lesson, Harrowgate Fen Airstrip (student)',
      pilot: 'R. Featherstonehaugh-Imai',
      aircraft: 'Fenbird 2',
      device: 'synthetic log (compass-debrief synth)',
      comment: 'Invented lesson: eight compass turns, each rolled out when the compass showed the target.',
    },
  } satisfies Omit<GpsNoiseOptions, 'file' | 'format'>,
} as const;
