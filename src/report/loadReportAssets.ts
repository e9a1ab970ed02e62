// loadReportAssets: reads the report template files and the chart library from disk (I/O edge).
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { InputError } from '../errors.js';
import type { ReportAssets } from './renderReport.js';
import { packageRoot } from '../util/packageRoot.js';

export { packageRoot } from '../util/packageRoot.js';

function readText(path: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (e) {
    throw new InputError(path, `cannot read a report asset: ${(e as Error).message}`, { hint: 'reinstall compass-debrief' });
  }
}

/**
 * Reads report-template/report.html, report.css, report.js and plotly.js-dist-min's plotly.min.js
 * (resolved through Node's module resolution from this package).
 * @param templateDir folder of the template files; defaults to <package root>/report-template
 * @throws InputError naming the file that is missing or unreadable
 */
export function loadReportAssets(templateDir: string = join(packageRoot(), 'report-template')): ReportAssets {
  let plotlyPath: string;
  try {
    plotlyPath = createRequire(import.meta.url).resolve('plotly.js-dist-min');
  } catch {
    throw new InputError('plotly.js-dist-min', 'the chart library is not installed', { hint: 'run npm install' });
  }
  return {
    html: readText(join(templateDir, 'report.html')),
    css: readText(join(templateDir, 'report.css')),
    js: readText(join(templateDir, 'report.js')),
    plotlyJs: readText(plotlyPath),
    sha256Base64: (text: string) => createHash('sha256').update(text, 'utf8').digest('base64'),
  };
}
