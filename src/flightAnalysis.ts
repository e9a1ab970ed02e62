// FlightAnalysis: everything one run of the pipeline produced for one flight.
import type { FlightLog } from './log/flightLog.js';
import type { FlightState } from './state/flightState.js';
import type { FieldAlongPath } from './magnetic/fieldAlongPath.js';
import type { CompassTrace } from './compass/compassTrace.js';
import type { Analysis } from './analysis/analysisTypes.js';
import type { LogHealth, LogWarning } from './log/flightLog.js';
import type { CompassProfile } from './compass/compassProfile.js';
import type { CalibrationResult } from './compass/calibrateProfile.js';

export interface FlightAnalysis {
  log: FlightLog;
  health: LogHealth;
  state: FlightState;
  field: FieldAlongPath;
  compass: CompassTrace;
  analysis: Analysis;
  /** Every warning of every stage, in pipeline order. */
  warnings: LogWarning[];
  /** The compass profile the trace was simulated with (fitted, when observations were given). */
  profile: CompassProfile;
  /** The fit of the profile to observed readings, when they were given. */
  calibration?: CalibrationResult;
  /** Wall time of each stage [ms], for progress and the bench. */
  timingsMs: Record<string, number>;
}
