// Test-side IGC writer (FAI IGC technical specification, Appendix A layouts): A record, HFDTE in the
// DATE:DDMMYY,NN form, I record declaring FXA, B records with lat/lon in thousandths of a minute.
import type { FlightLog } from '../../../src/log/flightLog.js';

const pad = (v: number, n: number) => String(v).padStart(n, '0');

/** DDMMmmm + N/S (2 degree digits) or DDDMMmmm + E/W (3), rounded to 0.001 minute with carry. */
export function igcAngleField(deg: number, degDigits: 2 | 3): string {
  const milli = Math.round(Math.abs(deg) * 60000);
  const d = Math.floor(milli / 60000);
  const rest = milli - d * 60000;
  const hemi = degDigits === 2 ? (deg < 0 ? 'S' : 'N') : deg < 0 ? 'W' : 'E';
  return `${pad(d, degDigits)}${pad(Math.floor(rest / 1000), 2)}${pad(rest % 1000, 3)}${hemi}`;
}

function altField(m: number): string {
  const r = Math.round(m);
  return r < 0 ? `-${pad(-r, 4)}` : pad(r, 5);
}

/** Writes a log (1 s steps assumed) as an IGC file with CR LF line ends. Times are rounded to whole seconds. */
export function writeIgc(log: FlightLog): string {
  const first = new Date(Math.round(log.t[0]) * 1000);
  const lines = [
    'AXXXFEN Fenbird test recorder (invented)',
    `HFDTEDATE:${pad(first.getUTCDate(), 2)}${pad(first.getUTCMonth() + 1, 2)}${pad(first.getUTCFullYear() % 100, 2)},01`,
    'HFPLTPILOTINCHARGE:P. Okonkwo-Lindqvist',
    'HFALGALTGPS:GEO',
    'I013638FXA',
  ];
  for (let i = 0; i < log.t.length; i++) {
    const d = new Date(Math.round(log.t[i]) * 1000);
    const time = `${pad(d.getUTCHours(), 2)}${pad(d.getUTCMinutes(), 2)}${pad(d.getUTCSeconds(), 2)}`;
    lines.push(`B${time}${igcAngleField(log.lat[i], 2)}${igcAngleField(log.lon[i], 3)}A${altField(log.altM[i] - 30)}${altField(log.altM[i])}006`);
  }
  return `${lines.join('\r\n')}\r\n`;
}
