// Parses the --wind option: DDD/SS (from, true, knots), calm, auto, or a table file handled by the caller.
import { KT_MS } from '../src/constants.js';
import { UsageError } from './usageError.js';

export type WindArg = { kind: 'calm' } | { kind: 'auto' } | { kind: 'given'; fromDegTrue: number; speedMs: number } | { kind: 'file'; path: string };

/** Largest wind speed accepted on the command line [kt]; anything above is surely a typo. */
const MAX_WIND_KT = 200;

/**
 * `250/20` → wind from 250° true at 20 kt; `calm`; `auto`; anything else that names an existing-looking
 * file (contains a path separator or ends .csv/.txt) → a wind table file. Throws UsageError otherwise.
 */
export function parseWind(text: string, command = 'report'): WindArg {
  const s = text.trim().toLowerCase();
  if (s === 'calm') return { kind: 'calm' };
  if (s === 'auto') return { kind: 'auto' };
  const m = /^(\d{1,3}(?:\.\d+)?)\s*\/\s*(\d{1,3}(?:\.\d+)?)$/.exec(s);
  if (m) {
    const fromDeg = Number(m[1]);
    const speedKt = Number(m[2]);
    if (!(fromDeg >= 0 && fromDeg <= 360)) throw new UsageError(command, `--wind ${text}: direction must be 0 to 360 degrees true`);
    if (!(speedKt >= 0 && speedKt <= MAX_WIND_KT)) throw new UsageError(command, `--wind ${text}: speed must be 0 to ${MAX_WIND_KT} kt`);
    return { kind: 'given', fromDegTrue: fromDeg % 360, speedMs: speedKt * KT_MS };
  }
  if (/[\\/]/.test(text) && /\.(csv|txt)$/i.test(text)) return { kind: 'file', path: text };
  if (/\.(csv|txt)$/i.test(text)) return { kind: 'file', path: text };
  throw new UsageError(command, `--wind ${text}: expected DDD/SS (direction from, true, and speed in knots, e.g. 250/20), calm, auto, or a wind table file (.csv)`);
}
