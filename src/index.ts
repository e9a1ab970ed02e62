// The public API of compass-debrief: read a log, analyse it, and write what the CLI writes.
// Everything below src/ except the file readers and writers runs in a browser too.

export { analyseFlight, type AnalyseOptions } from './analyseFlight.js';
export type { FlightAnalysis } from './flightAnalysis.js';
export { readLogFile } from './import/readLog.js';
export { parseLogBytes, type ReadOptions } from './import/parseLog.js';
export { cleanLog } from './log/cleanLog.js';
export type { FlightLog, LogFormat, LogHealth, LogMeta, LogWarning } from './log/flightLog.js';
export type { FlightState, WindEstimate, WindSource } from './state/flightState.js';
export type { WindOption } from './state/windOption.js';
export { reconstructState, type StateOptions } from './state/reconstructState.js';
export type { FieldAlongPath } from './magnetic/fieldAlongPath.js';
export { computeFieldAlongPath } from './magnetic/fieldAlongPath.js';
export { fieldAtPoint, decimalYearOf } from './magnetic/wmm2025.js';
export type { CompassTrace } from './compass/compassTrace.js';
export { simulateCompass } from './compass/simulateCompass.js';
export { DEFAULT_COMPASS_PROFILE, COMPASS_PROFILE_FIELDS, parseCompassProfile, type CompassProfile } from './compass/compassProfile.js';
export { levelTurnReadingDeg, accelerationReadingDeg } from './compass/turningError.js';
export { calibrateProfile, type CompassObservations, type CalibrationResult } from './compass/calibrateProfile.js';
export { fitSmithCoefficients, deviationAtDeg, compassForMagneticDeg } from './deviation/smithCoefficients.js';
export { parseSwingRecord, swingReport, type SwingReport } from './deviation/swingRecord.js';
export { analyseDebrief, type DebriefOptions } from './analysis/analyseDebrief.js';
export type { Analysis, TurnResult, SpeedEpisode, DivergenceWindow, ExcursionResult } from './analysis/analysisTypes.js';
export { samplesCsv, SAMPLES_CONTRACT_COLUMNS } from './report/samplesCsv.js';
export { buildSummary, summaryJson } from './report/summaryJson.js';
export { buildReportModel } from './report/reportModel.js';
export { renderReport } from './report/renderReport.js';
export { loadReportAssets } from './report/loadReportAssets.js';
export { InputError, OptionError, ParseError } from './errors.js';
