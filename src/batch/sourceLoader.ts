// Running a module from the TypeScript sources (vitest) in a child process: a small loader, given to
// `node --import`, that strips the types with the TypeScript compiler's transpileModule.
import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';

/**
 * Node module customization hooks (node:module register, Node ≥ 20.6): `.js` specifiers written in the
 * sources resolve to the `.ts` file beside them when that exists, and `.ts` files load as ES modules
 * transpiled one at a time (isolated, types removed; the same contract as vitest's own transform).
 */
function loaderSource(typescriptUrl: string): string {
  return `
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
let ts;
export async function resolve(spec, ctx, next) {
  if (ctx.parentURL && ctx.parentURL.endsWith('.ts') && /^\\.{1,2}\\//.test(spec) && spec.endsWith('.js')) {
    const u = new URL(spec.slice(0, -3) + '.ts', ctx.parentURL);
    if (existsSync(fileURLToPath(u))) return { url: u.href, format: 'module', shortCircuit: true };
  }
  return next(spec, ctx);
}
export async function load(url, ctx, next) {
  if (!url.startsWith('file:') || !url.endsWith('.ts')) return next(url, ctx);
  ts ??= (await import(${JSON.stringify(typescriptUrl)})).default;
  const file = fileURLToPath(url);
  const out = ts.transpileModule(readFileSync(file, 'utf8'), {
    fileName: file,
    compilerOptions: { module: ts.ModuleKind.ESNext, target: ts.ScriptTarget.ES2022, sourceMap: false, inlineSourceMap: true },
  });
  return { format: 'module', source: out.outputText, shortCircuit: true };
}`;
}

/** A `data:` URL module that registers the loader; for `node --import` (a child process run from sources). */
export function sourceLoaderImportUrl(): string {
  const tsUrl = pathToFileURL(createRequire(import.meta.url).resolve('typescript')).href;
  const register = `import { register } from 'node:module'; register(${JSON.stringify('data:text/javascript,' + encodeURIComponent(loaderSource(tsUrl)))});`;
  return 'data:text/javascript,' + encodeURIComponent(register);
}
