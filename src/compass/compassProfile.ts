// CompassProfile: the parameters of one direct-reading (wet) compass, as read from a JSON profile file.
//
// JSON form (every field optional; a missing field takes the default below; unknown fields are rejected):
//   {
//     "name": "generic light-aircraft wet compass",
//     "periodS": 4,               natural period of the card's azimuth swing at refHorizontalNt [s]
//     "refHorizontalNt": 20000,   horizontal field at which periodS and dampingRatio hold [nT]
//     "dampingRatio": 0.7,        damping ratio ζ at refHorizontalNt [-] (1 = dead-beat)
//     "tiltLimitDeg": 18,         half-angle of the card's tilt freedom relative to the bowl [deg]
//     "tiltLagS": 0.3,            first-order time constant of the card's tilt following apparent gravity [s] (0 = instant)
//     "swirlTimeConstantS": 10,   spin-up time constant of the liquid by the bowl's yaw rate [s]
//     "swirlCoupling": 1,         fully spun-up liquid rate near the card / bowl yaw rate [-] (0 = no swirl)
//     "residualDipDeg": 3,        card tilt (north end down) in level unaccelerated flight at the reference field [deg]
//                                 (0 = infinitely pendulous card)
//     "refVerticalNt": 45000,     vertical field |Z| at which residualDipDeg holds [nT]
//     "unreliableDirectiveRatio": 0.3,  below this |B_p|/H the card is flagged unreliable [-]
//     "cautionZoneUnreliable": false    also flag samples in the WMM caution zone (2000 ≤ H < 6000 nT)
//   }
// Damping scales as ζ = ζ_ref·sqrt(H_ref/|B_p|) and the natural frequency as ω_n = 2π/T0·sqrt(|B_p|/H_ref)
// (PHYSICS §1.6), i.e. the liquid's drag per unit inertia 2ζω_n is the same everywhere; the magnet's stiffness is not.
import { OptionError } from '../errors.js';

/** Parameters of one compass. Units in the names; see the file comment for the JSON form. */
export interface CompassProfile {
  name: string;
  periodS: number;
  refHorizontalNt: number;
  dampingRatio: number;
  tiltLimitDeg: number;
  tiltLagS: number;
  swirlTimeConstantS: number;
  swirlCoupling: number;
  residualDipDeg: number;
  refVerticalNt: number;
  unreliableDirectiveRatio: number;
  cautionZoneUnreliable: boolean;
}

/** Where a default value comes from. */
export type ValueOrigin = 'handbook' | 'common practice' | 'from memory' | 'derived estimate';

/** Documentation of one numeric profile field: unit, allowed range (inclusive unless open), default, origin. */
export interface ProfileFieldDoc {
  unit: string;
  min: number;
  max: number;
  minOpen: boolean;
  defaultValue: number;
  origin: ValueOrigin;
  note: string;
}

type NumericField = Exclude<keyof CompassProfile, 'name' | 'cautionZoneUnreliable'>;

/**
 * Every numeric field with unit, range, default and the origin of the default. Honest note: open sources give
 * no numbers for the period, damping, swirl or tilt lag of aircraft compasses (the test limits sit in SAE AS398A,
 * invoked by FAA TSO-C7d, not consulted); those defaults are estimates to be calibrated (PHYSICS §1.6).
 */
export const COMPASS_PROFILE_FIELDS: Readonly<Record<NumericField, ProfileFieldDoc>> = {
  periodS: {
    unit: 's', min: 0.2, max: 60, minOpen: false, defaultValue: 4, origin: 'derived estimate',
    note: 'PHYSICS §1.6: T0 ~ 2–8 s at H ~ 20 µT from M ~ 0.1–0.2 A m², I ~ 2e-6 kg m²; no published value found.',
  },
  refHorizontalNt: {
    unit: 'nT', min: 1000, max: 60000, minOpen: false, defaultValue: 20000, origin: 'derived estimate',
    note: 'Reference field of the period estimate (PHYSICS §1.6: "at H ~ 20 µT"), roughly mid-latitude Europe/USA.',
  },
  dampingRatio: {
    unit: '-', min: 0.05, max: 5, minOpen: false, defaultValue: 0.7, origin: 'derived estimate',
    note: 'PHYSICS §1.6: ζ_ref ~ 0.6–1.0; "aperiodic (dead-beat)" is a requirement wording (EASA/JAA ATPL texts, secondary), not a value.',
  },
  tiltLimitDeg: {
    unit: 'deg', min: 1, max: 90, minOpen: false, defaultValue: 18, origin: 'handbook',
    note: 'FAA PHAK FAA-H-8083-25A ch. 7 p. 7-23: float may "tilt up to approximately 18° angle of bank".',
  },
  tiltLagS: {
    unit: 's', min: 0, max: 5, minOpen: false, defaultValue: 0.3, origin: 'derived estimate',
    note: 'PHYSICS §1.6: pendulous tilt mode fast (sub-second); first-order lag ~0.3 s; no published value found.',
  },
  swirlTimeConstantS: {
    unit: 's', min: 0.5, max: 600, minOpen: false, defaultValue: 10, origin: 'derived estimate',
    note: 'PHYSICS §1.6: gap diffusion 4–6 s, Ekman spin-up 55–110 s for kerosene-like fluid; recommended 5–30 s, default 10 s.',
  },
  swirlCoupling: {
    unit: '-', min: 0, max: 1, minOpen: false, defaultValue: 1, origin: 'derived estimate',
    note: 'Upper bound: liquid at the card fully co-rotates with the bowl. Cards are made small to limit swirl (Britannica, "swirl error"); calibrate.',
  },
  residualDipDeg: {
    unit: 'deg', min: 0, max: 20, minOpen: false, defaultValue: 3, origin: 'handbook',
    note: 'ATPL training texts (secondary): residual dip "reduced to about 2–3°" in mid latitudes; PHYSICS §1.3.',
  },
  refVerticalNt: {
    unit: 'nT', min: 1000, max: 70000, minOpen: false, defaultValue: 45000, origin: 'derived estimate',
    note: 'Vertical field at which residualDipDeg holds; PHYSICS §1.3 scales 3° at F 50 µT, dip 66 (|Z| ≈ 45.7 µT).',
  },
  unreliableDirectiveRatio: {
    unit: '-', min: 0, max: 1, minOpen: false, defaultValue: 0.3, origin: 'derived estimate',
    note: 'PHYSICS §1.4: flag samples with |B_p|/H below ~0.3 (card close to losing its directive force).',
  },
};

/** The default profile (every field at its documented default). */
export const DEFAULT_COMPASS_PROFILE: Readonly<CompassProfile> = Object.freeze({
  name: 'generic light-aircraft wet compass (estimated values, uncalibrated)',
  periodS: COMPASS_PROFILE_FIELDS.periodS.defaultValue,
  refHorizontalNt: COMPASS_PROFILE_FIELDS.refHorizontalNt.defaultValue,
  dampingRatio: COMPASS_PROFILE_FIELDS.dampingRatio.defaultValue,
  tiltLimitDeg: COMPASS_PROFILE_FIELDS.tiltLimitDeg.defaultValue,
  tiltLagS: COMPASS_PROFILE_FIELDS.tiltLagS.defaultValue,
  swirlTimeConstantS: COMPASS_PROFILE_FIELDS.swirlTimeConstantS.defaultValue,
  swirlCoupling: COMPASS_PROFILE_FIELDS.swirlCoupling.defaultValue,
  residualDipDeg: COMPASS_PROFILE_FIELDS.residualDipDeg.defaultValue,
  refVerticalNt: COMPASS_PROFILE_FIELDS.refVerticalNt.defaultValue,
  unreliableDirectiveRatio: COMPASS_PROFILE_FIELDS.unreliableDirectiveRatio.defaultValue,
  cautionZoneUnreliable: false,
});

/**
 * The textbook card: infinitely pendulous, no tilt stop reached in practice (90°), instant tilt, no swirl,
 * with the default period and damping. Its static reading is exactly the closed forms of PHYSICS §1.2.
 */
export const TEXTBOOK_COMPASS_PROFILE: Readonly<CompassProfile> = Object.freeze({
  ...DEFAULT_COMPASS_PROFILE,
  name: 'textbook card (infinitely pendulous, no swirl, instant tilt, tilt free to 90°)',
  tiltLimitDeg: 90,
  tiltLagS: 0,
  swirlCoupling: 0,
  residualDipDeg: 0,
});

/** Checks one numeric field against its documented range; throws OptionError naming field and range. */
function checkNumber(field: NumericField, v: unknown, where: string): number {
  const d = COMPASS_PROFILE_FIELDS[field];
  const range = `${d.minOpen ? '(' : '['}${d.min}, ${d.max}] ${d.unit}`;
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    throw new OptionError(`${where}.${field}`, `must be a finite number in ${range}, got ${JSON.stringify(v)}`);
  }
  if (v < d.min || (d.minOpen && v === d.min) || v > d.max) {
    throw new OptionError(`${where}.${field}`, `${v} is outside ${range}`);
  }
  return v;
}

/**
 * Checks a complete profile (e.g. one built in code) and returns it unchanged; throws OptionError naming the
 * field and its range. Cross-field rule: residualDipDeg must be below the reference dip atan(refVerticalNt/refHorizontalNt).
 */
export function validateCompassProfile(p: CompassProfile, where = 'compass profile'): CompassProfile {
  for (const f of Object.keys(COMPASS_PROFILE_FIELDS) as NumericField[]) checkNumber(f, p[f], where);
  if (typeof p.name !== 'string') throw new OptionError(`${where}.name`, 'must be a string');
  if (typeof p.cautionZoneUnreliable !== 'boolean') throw new OptionError(`${where}.cautionZoneUnreliable`, 'must be true or false');
  const refDipDeg = (Math.atan2(p.refVerticalNt, p.refHorizontalNt) * 180) / Math.PI;
  if (p.residualDipDeg >= refDipDeg) {
    throw new OptionError(`${where}.residualDipDeg`, `${p.residualDipDeg} must be below the reference dip ${refDipDeg.toFixed(1)} deg`);
  }
  return p;
}

/**
 * Parses a compass profile from JSON data (already JSON.parse'd). Missing fields take
 * {@link DEFAULT_COMPASS_PROFILE}'s values; unknown fields and out-of-range values throw OptionError naming the
 * field and the allowed range. Example: parseCompassProfile({ periodS: 3, dampingRatio: 0.9 }).
 */
export function parseCompassProfile(json: unknown, where = 'compass profile'): CompassProfile {
  if (json === null || typeof json !== 'object' || Array.isArray(json)) {
    throw new OptionError(where, 'must be a JSON object of profile fields');
  }
  const src = json as Record<string, unknown>;
  const known = new Set<string>(Object.keys(DEFAULT_COMPASS_PROFILE));
  for (const k of Object.keys(src)) {
    if (!known.has(k)) throw new OptionError(`${where}.${k}`, `unknown field (known: ${[...known].join(', ')})`);
  }
  const p: CompassProfile = { ...DEFAULT_COMPASS_PROFILE };
  if (src.name !== undefined) {
    if (typeof src.name !== 'string') throw new OptionError(`${where}.name`, 'must be a string');
    p.name = src.name;
  }
  if (src.cautionZoneUnreliable !== undefined) {
    if (typeof src.cautionZoneUnreliable !== 'boolean') {
      throw new OptionError(`${where}.cautionZoneUnreliable`, 'must be true or false');
    }
    p.cautionZoneUnreliable = src.cautionZoneUnreliable;
  }
  for (const f of Object.keys(COMPASS_PROFILE_FIELDS) as NumericField[]) {
    if (src[f] !== undefined) p[f] = checkNumber(f, src[f], where);
  }
  return validateCompassProfile(p, where);
}
