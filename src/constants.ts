// Physical and unit constants, each with its unit and source. SI inside the library.

/** Standard acceleration of gravity [m/s²]. Source: CGPM 1901, BIPM SI Brochure (exact by definition). */
export const G0_MS2 = 9.80665;

/** One international knot [m/s] = 1852 m per hour (exact by definition of the nautical mile). */
export const KT_MS = 1852 / 3600;

/** One international foot [m] (exact, 1959 international yard and pound agreement). */
export const FT_M = 0.3048;

/** One nautical mile [m] (exact, International Hydrographic Conference 1929). */
export const NM_M = 1852;

/** WGS-84 semi-major axis [m]. Source: NIMA TR8350.2, 3rd ed., table 3.1. */
export const WGS84_A_M = 6378137.0;

/** WGS-84 flattening [-]. Source: NIMA TR8350.2, 3rd ed., table 3.1. */
export const WGS84_F = 1 / 298.257223563;

/** WGS-84 first eccentricity squared, derived from the flattening: e² = f(2 − f). */
export const WGS84_E2 = WGS84_F * (2 - WGS84_F);

/** Degrees to radians. */
export const DEG = Math.PI / 180;

/** Radians to degrees. */
export const RAD = 180 / Math.PI;

/** Standard-rate (rate-one) turn [deg/s]: 360° in two minutes. Source: FAA Instrument Flying Handbook FAA-H-8083-15B ch. 7. */
export const STANDARD_RATE_DPS = 3;

/** Usual maximum permitted deviation of a compensated compass in level flight [deg]. Source: 14 CFR 25.1327(b). */
export const MAX_DEVIATION_DEG = 10;
