// The package's root folder (the one holding package.json), found from a module's own URL.
import { existsSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { InputError } from '../errors.js';

/**
 * Walks up from `moduleUrl` (default: this module) to the nearest folder with a package.json. Works from
 * the sources (vitest) and from dist/ after tsc. Throws InputError when there is none.
 */
export function packageRoot(moduleUrl: string = import.meta.url): string {
  let dir = path.dirname(fileURLToPath(moduleUrl));
  for (;;) {
    if (existsSync(path.join(dir, 'package.json'))) return dir;
    const up = path.dirname(dir);
    if (up === dir) throw new InputError(fileURLToPath(moduleUrl), 'no package.json above this module', { hint: 'install compass-debrief as a package' });
    dir = up;
  }
}
