// Side files beside a log: aircraft and pilot tags (`<log>.tags.json`) and the turn plan (`<log>.plan.csv`).
import { promises as fsp } from 'node:fs';
import path from 'node:path';
import { InputError } from '../errors.js';
import { PLAN_SUFFIX, TAGS_SUFFIX } from './findLogs.js';

export interface FlightTags {
  aircraft?: string;
  pilot?: string;
  /** The side file read, when there was one. */
  file?: string;
}

/** Longest tag kept [characters]: a name, never a document. */
export const MAX_TAG_CHARS = 200;

/** Side-file paths of a log with `suffix`, in the order looked for: `lesson.gpx<suffix>`, then `lesson<suffix>`. */
export function sideFileCandidates(logPath: string, suffix: string): string[] {
  const dir = path.dirname(logPath);
  const name = path.basename(logPath);
  const base = name.replace(/\.[^.]*$/, '');
  const c = [path.join(dir, name + suffix)];
  if (base !== name) c.push(path.join(dir, base + suffix));
  return c;
}

/**
 * The turn plan beside a log (`lesson.gpx.plan.csv` or `lesson.plan.csv`, as for `report --plan`), as text.
 * @returns undefined when there is none
 * @throws InputError naming the plan file when it exists but cannot be read
 */
export async function readPlanSideFile(logPath: string): Promise<{ file: string; text: string } | undefined> {
  for (const file of sideFileCandidates(logPath, PLAN_SUFFIX)) {
    try {
      return { file, text: await fsp.readFile(file, 'utf8') };
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'ENOENT') continue;
      throw new InputError(file, `cannot read the plan file: ${(err as NodeJS.ErrnoException).code ?? (err as Error).message}`);
    }
  }
  return undefined;
}

/**
 * Reads the first side file that exists: a JSON object whose optional members `aircraft` and `pilot`
 * are strings (trimmed; an empty string counts as absent). Other members are ignored.
 * @returns {} when there is no side file
 * @throws InputError naming the side file when it is not such an object or a tag is over 200 characters
 */
export async function readTags(logPath: string): Promise<FlightTags> {
  for (const file of sideFileCandidates(logPath, TAGS_SUFFIX)) {
    let text: string;
    try {
      text = await fsp.readFile(file, 'utf8');
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'ENOENT') continue;
      throw new InputError(file, `cannot read the tags file: ${(err as NodeJS.ErrnoException).code ?? (err as Error).message}`);
    }
    const hint = 'a tags file is JSON like {"aircraft": "Fenbird 2", "pilot": "P. Okonkwo-Lindqvist"}';
    let json: unknown;
    try {
      json = JSON.parse(text);
    } catch (err) {
      throw new InputError(file, `not valid JSON: ${(err as Error).message}`, { hint });
    }
    if (json === null || typeof json !== 'object' || Array.isArray(json)) throw new InputError(file, 'expected a JSON object', { hint });
    const tags: FlightTags = { file };
    for (const key of ['aircraft', 'pilot'] as const) {
      const v = (json as Record<string, unknown>)[key];
      if (v === undefined || v === null) continue;
      if (typeof v !== 'string') throw new InputError(file, `"${key}" must be a string, got ${typeof v}`, { hint });
      const s = v.trim();
      if (s.length > MAX_TAG_CHARS) throw new InputError(file, `"${key}" is longer than ${MAX_TAG_CHARS} characters`, { hint });
      if (s !== '') tags[key] = s;
    }
    return tags;
  }
  return {};
}
