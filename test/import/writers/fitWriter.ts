// Test-side FIT file writer over fit-file-parser's own encoder (FitEncoder: header, definitions, data
// messages, CRC-16). Field numbers, base types, scales and offsets follow the FIT Profile as published in
// the Garmin FIT SDK (record #20, aviation_attitude #178, file_id #0) [from memory, cross-checked against
// the profile table shipped in fit-file-parser].
import { FitBaseType, FitEncoder } from 'fit-file-parser/encoder';

/** One fix to write: t [s UTC], lat/lon [deg], altM [m], gsMs [m/s]; NaN fields are left out. */
export interface FitFix {
  t: number;
  lat: number;
  lon: number;
  altM: number;
  gsMs: number;
}

/** One attitude sample: t [s UTC], roll/pitch [deg]. */
export interface FitAttitudeSample {
  t: number;
  rollDeg: number;
  pitchDeg: number;
}

const FIT_EPOCH_S = Date.UTC(1989, 11, 31) / 1000; // FIT Protocol: timestamps count from 1989-12-31 00:00 UTC

/** Degrees to FIT semicircles: 2^31 semicircles = 180° (FIT Profile, position_lat/position_long). */
export function toSemicircles(deg: number): number {
  return Math.round((deg / 180) * 2 ** 31);
}

/** Writes a FIT activity: file_id, one record per fix, optional aviation_attitude samples. */
export function writeFit(fixes: FitFix[], attitude: FitAttitudeSample[] = []): Uint8Array {
  const enc = new FitEncoder();
  const first = fixes.length > 0 ? fixes[0].t : FIT_EPOCH_S;
  enc.writeMessage(0, [
    { number: 0, size: 1, baseType: FitBaseType.Enum, value: 4 }, // type = activity
    { number: 4, size: 4, baseType: FitBaseType.Uint32, value: Math.floor(first - FIT_EPOCH_S) },
  ]);
  const events: Array<{ t: number; write: () => void }> = [];
  for (const f of fixes) {
    events.push({
      t: f.t,
      write: () =>
        enc.writeMessage(
          20,
          [
            { number: 253, size: 4, baseType: FitBaseType.Uint32, value: Math.round(f.t - FIT_EPOCH_S) },
            // NaN → the sint32 invalid value 0x7FFFFFFF (FIT Protocol, base type table).
            { number: 0, size: 4, baseType: FitBaseType.Sint32, value: Number.isFinite(f.lat) ? toSemicircles(f.lat) : 0x7fffffff },
            { number: 1, size: 4, baseType: FitBaseType.Sint32, value: Number.isFinite(f.lon) ? toSemicircles(f.lon) : 0x7fffffff },
            // enhanced_altitude: uint32, scale 5, offset 500 m; enhanced_speed: uint32, scale 1000 (m/s).
            { number: 78, size: 4, baseType: FitBaseType.Uint32, value: Number.isFinite(f.altM) ? Math.round((f.altM + 500) * 5) : 0xffffffff },
            { number: 73, size: 4, baseType: FitBaseType.Uint32, value: Number.isFinite(f.gsMs) ? Math.round(f.gsMs * 1000) : 0xffffffff },
          ],
          1,
        ),
    });
  }
  for (const a of attitude) {
    const whole = Math.floor(a.t);
    events.push({
      t: a.t,
      write: () =>
        enc.writeMessage(
          178,
          [
            { number: 253, size: 4, baseType: FitBaseType.Uint32, value: whole - FIT_EPOCH_S },
            { number: 0, size: 2, baseType: FitBaseType.Uint16, value: Math.round((a.t - whole) * 1000) },
            // pitch, roll: sint16 radians, scale 10430.38.
            { number: 2, size: 2, baseType: FitBaseType.Sint16, value: Math.round(((a.pitchDeg * Math.PI) / 180) * 10430.38) },
            { number: 3, size: 2, baseType: FitBaseType.Sint16, value: Math.round(((a.rollDeg * Math.PI) / 180) * 10430.38) },
          ],
          2,
        ),
    });
  }
  events.sort((x, y) => x.t - y.t);
  for (const e of events) e.write();
  return enc.close();
}
