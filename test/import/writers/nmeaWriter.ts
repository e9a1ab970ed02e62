// Test-side NMEA 0183 writer: RMC + GGA per fix (field layouts of NMEA 0183 v4.x, from memory), minutes
// with 4 decimals, time to 0.01 s, checksums by the independent helper.
import { KT_MS } from '../../../src/constants.js';
import type { FlightLog } from '../../../src/log/flightLog.js';
import { withChecksum } from './nmeaChecksum.js';

const pad = (v: number, n: number) => String(v).padStart(n, '0');

/** ddmm.mmmm (2 degree digits) or dddmm.mmmm (3), and the hemisphere letter, rounded to 1e-4 minute with carry. */
export function nmeaAngleFields(deg: number, degDigits: 2 | 3): [string, string] {
  const tenThousandths = Math.round(Math.abs(deg) * 600000);
  const d = Math.floor(tenThousandths / 600000);
  const rest = tenThousandths - d * 600000; // 1e-4 minutes
  const minutes = `${pad(Math.floor(rest / 10000), 2)}.${pad(rest % 10000, 4)}`;
  const hemi = degDigits === 2 ? (deg < 0 ? 'S' : 'N') : deg < 0 ? 'W' : 'E';
  return [`${pad(d, degDigits)}${minutes}`, hemi];
}

/** Writes RMC and GGA sentences for each row (CR LF). */
export function writeNmea(log: FlightLog): string {
  const out: string[] = [];
  for (let i = 0; i < log.t.length; i++) {
    const cs = Math.round(log.t[i] * 100); // centiseconds
    const d = new Date(Math.floor(cs / 100) * 1000);
    const time = `${pad(d.getUTCHours(), 2)}${pad(d.getUTCMinutes(), 2)}${pad(d.getUTCSeconds(), 2)}.${pad(cs % 100, 2)}`;
    const date = `${pad(d.getUTCDate(), 2)}${pad(d.getUTCMonth() + 1, 2)}${pad(d.getUTCFullYear() % 100, 2)}`;
    const [lat, ns] = nmeaAngleFields(log.lat[i], 2);
    const [lon, ew] = nmeaAngleFields(log.lon[i], 3);
    const kt = log.gsMs ? (log.gsMs[i] / KT_MS).toFixed(2) : '';
    const cog = log.trackDegTrue ? log.trackDegTrue[i].toFixed(2) : '';
    out.push(withChecksum(`GNRMC,${time},A,${lat},${ns},${lon},${ew},${kt},${cog},${date},,,A`));
    out.push(withChecksum(`GNGGA,${time},${lat},${ns},${lon},${ew},1,12,0.7,${log.altM[i].toFixed(1)},M,47.0,M,,`));
  }
  return `${out.join('\r\n')}\r\n`;
}
