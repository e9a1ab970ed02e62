// Loads a CommonJS package with require instead of import. Importing one from an ES module makes Node first
// scan its whole source for the names it exports (cjs-module-lexer); in a fresh process or batch worker
// that scan cost 15–25 ms per package, and its own JIT compilation more (papaparse, saxes, the
// geomagnetism model, better-sqlite3). require gives the same module.exports without the scan.
import { createRequire } from 'node:module';

/** require, resolving packages from this package's node_modules. */
export const requireCjs = createRequire(import.meta.url);
