// What the batch overview (index.html, overview.csv) is made from: this run's flights and the catalogue.
import type { CatalogueRow } from './flightCatalogue.js';
import type { SkippedPath } from './findLogs.js';

/**
 * What this run did with an input: analysed it; found it unchanged since a previous run (same content,
 * options and tool version: outputs kept); found it a copy of another input of this run; could not read it.
 */
export type RunState = 'analysed' | 'unchanged' | 'duplicate' | 'unread';

export interface OverviewFlight {
  /** The log's path as found. */
  inputPath: string;
  run: RunState;
  /** Extra words, e.g. 'same content as logs/a.gpx'; '' when none. */
  note: string;
  /** The catalogue row (for an unread input, a row with status failed and empty facts). */
  row: CatalogueRow;
}

export interface BatchOverview {
  /** When the overview was made [ISO 8601 UTC]. */
  generatedAtUtc: string;
  toolVersion: string;
  /** The analysis options in words (wind, profile, card), printed under the title. */
  optionsText: string;
  /** One entry per input of this run, in input order. */
  flights: OverviewFlight[];
  /** Every catalogued flight whose report is in the folder (earlier runs too): the trends across lessons. */
  catalogue: CatalogueRow[];
  /** Files and folders left out of the search, with why. */
  skipped: SkippedPath[];
}
