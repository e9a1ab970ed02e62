// FlightAnalysis: everything one run of the pipeline produced for one flight.
import type { FlightLog } from './log/flightLog.js';
import type { FlightState } from './state/flightState.js';
import type { FieldAlongPath } from './magnetic/fieldAlongPath.js';
import type { CompassTrace } from './compass/compassTrace.js';
import type { Analysis } from './analysis/analysisTypes.js';
import type { LogHealth, LogWarning } from './log/flightLog.js';

export interface FlightAnalysis {
  log: FlightLog;
  health: LogHealth;
  state: FlightState;
  field: FieldAlongPath;
  compass: CompassTrace;
  analysis: Analysis;
  /** Every warning of every stage, in pipeline order. */
  warnings: LogWarning[];
  /** Wall time of each stage [ms], for progress and the bench. */
  timingsMs: Record<string, number>;
}
