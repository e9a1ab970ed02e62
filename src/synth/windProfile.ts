// Wind of a flight script as an air-mass velocity (north, east) at any height.
import { DEG } from '../constants.js';
import type { ScriptWind, WindFrom } from './flightScript.js';

/** Air-mass velocity [m/s], NED north and east components (where the air moves to). */
export interface WindVectorMs {
  nMs: number;
  eMs: number;
}

/**
 * Wind "from" direction (true) and speed to the air-mass velocity: the air moves toward from + 180°,
 * so v_N = −S cos(from), v_E = −S sin(from). Example: 20 kt from 270 → (0, +20 kt), blowing east.
 */
export function windFromToVector(w: WindFrom): WindVectorMs {
  const a = w.fromDegTrue * DEG;
  return { nMs: -w.speedMs * Math.cos(a), eMs: -w.speedMs * Math.sin(a) };
}

/**
 * The wind of a script as a function of height above the ellipsoid [m] → air-mass velocity.
 * Constant wind: the same everywhere. Table: linear interpolation of the north/east components between
 * rows (not of direction and speed, so a veer through calm stays continuous), held constant beyond the
 * first and last rows. Function: evaluated as given. Undefined: calm.
 */
export function windProfile(wind: ScriptWind | undefined): (altM: number) => WindVectorMs {
  if (wind === undefined) return () => ({ nMs: 0, eMs: 0 });
  if (typeof wind === 'function') return (altM) => windFromToVector(wind(altM));
  if ('table' in wind) {
    const hM = wind.table.map((r) => r.altM);
    const vec = wind.table.map(windFromToVector);
    return (altM) => {
      if (altM <= hM[0]) return vec[0];
      const last = hM.length - 1;
      if (altM >= hM[last]) return vec[last];
      let i = 0;
      while (hM[i + 1] < altM) i++;
      const u = (altM - hM[i]) / (hM[i + 1] - hM[i]);
      return { nMs: vec[i].nMs + u * (vec[i + 1].nMs - vec[i].nMs), eMs: vec[i].eMs + u * (vec[i + 1].eMs - vec[i].eMs) };
    };
  }
  const v = windFromToVector(wind);
  return () => v;
}
