// loadReportAssets: reads the report template files and the chart library from disk (I/O edge).
import { createHash } from 'node:crypto';
import { readFileSync, statSync } from 'node:fs';
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

/** Base64 SHA-256 of a text's UTF-8 bytes with node:crypto. */
function nodeSha256Base64(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('base64');
}

/** Size and modification time of a file, to tell whether a cached read of it is still current. */
function fileStamp(path: string): string {
  try {
    const st = statSync(path);
    return `${st.size}:${st.mtimeMs}`;
  } catch {
    return 'unreadable';
  }
}

/** The last assets read per template folder and chart library path, with the files' stamps at the time. */
const cache = new Map<string, { stamp: string; assets: ReportAssets }>();

/**
 * Reads report-template/report.html, report.css, report.js and plotly.js-dist-min's plotly.min.js
 * (resolved through Node's module resolution from this package). The texts are kept for the process and
 * read again only when a file's size or modification time changes (a batch reads them once, not once a
 * flight); the same `sha256Base64` function comes back each time, so renderReport can keep its hash of
 * the 4.6 MB chart library.
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
  const paths = [join(templateDir, 'report.html'), join(templateDir, 'report.css'), join(templateDir, 'report.js'), plotlyPath];
  const key = paths.join('\0');
  const stamp = paths.map(fileStamp).join(' ');
  const hit = cache.get(key);
  if (hit !== undefined && hit.stamp === stamp) return { ...hit.assets };
  const assets: ReportAssets = {
    html: readText(paths[0]),
    css: readText(paths[1]),
    js: readText(paths[2]),
    plotlyJs: readText(paths[3]),
    sha256Base64: nodeSha256Base64,
  };
  cache.set(key, { stamp, assets });
  return { ...assets };
}
