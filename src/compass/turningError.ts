// Closed forms of the static compass errors (PHYSICS.md §1.2, §1.4): test oracles for the vector model and
// quick estimates for the analysis (roll-out cues). All for an infinitely pendulous card with no tilt stop.
// Degrees in and out; headings magnetic; bank right wing down +; dip down + (northern magnetic hemisphere).

const DEG = Math.PI / 180;
const RAD = 180 / Math.PI;

function to360(deg: number): number {
  const r = deg % 360;
  const w = r < 0 ? r + 360 : r;
  return w >= 360 ? 0 : w + 0;
}

function to180(deg: number): number {
  const w = to360(deg);
  return w > 180 ? w - 360 : w;
}

/**
 * Reading [0, 360) of the card in a steady coordinated level turn (card banked with the airframe, k = body z):
 * tan ψc = (sin ψm cos φ − tan μ sin φ) / cos ψm, evaluated with atan2 (quadrant from cos ψm).
 * @param headingDegMag magnetic heading ψm [deg]; @param bankDeg φ, right wing down + [deg] (right turn +);
 * @param dipDeg μ [deg], down +, |μ| < 90. Example: (0, 15, 55) → 339.7.
 */
// Source: Williams, "Compass Errors" (2001) eq. 2; PHYSICS.md §1.2.
export function levelTurnReadingDeg(headingDegMag: number, bankDeg: number, dipDeg: number): number {
  const p = headingDegMag * DEG, f = bankDeg * DEG;
  return to360(Math.atan2(Math.sin(p) * Math.cos(f) - Math.tan(dipDeg * DEG) * Math.sin(f), Math.cos(p)) * RAD);
}

/**
 * Reading [0, 360) with apparent gravity along body z at any pitch θ and bank φ (coordinated, climbing or
 * descending turn), from the field's horizontal and vertical intensities H > 0 and Z (down +), any unit:
 * ψc = atan2(H sin ψm cos φ − H cos ψm sin θ sin φ − Z cos θ sin φ, H cos ψm cos θ − Z sin θ).
 */
// Source: PHYSICS.md §1.2 (derived: B projected on the body x–y plane, read against body x).
export function coordinatedReadingDeg(headingDegMag: number, pitchDeg: number, bankDeg: number, hNt: number, zNt: number): number {
  const p = headingDegMag * DEG, t = pitchDeg * DEG, f = bankDeg * DEG;
  const sp = Math.sin(p), cp = Math.cos(p), st = Math.sin(t), ct = Math.cos(t), sf = Math.sin(f), cf = Math.cos(f);
  return to360(Math.atan2(hNt * sp * cf - hNt * cp * st * sf - zNt * ct * sf, hNt * cp * ct - zNt * st) * RAD);
}

/**
 * Reading [0, 360) under a steady along-heading acceleration a_x [m/s², forward +], wings level, level flight:
 * λ = atan(a_x / g), tan ψc = sin ψm / (cos ψm cos λ + tan μ sin λ) (atan2 form). Example: (90, 0.1 g, 65) → 078.0.
 */
// Source: Williams, "Compass Errors" (2001) eq. 3–4; PHYSICS.md §1.2.
export function accelerationReadingDeg(headingDegMag: number, accelAlongMs2: number, dipDeg: number, gMs2 = 9.80665): number {
  const p = headingDegMag * DEG, l = Math.atan(accelAlongMs2 / gMs2);
  return to360(Math.atan2(Math.sin(p), Math.cos(p) * Math.cos(l) + Math.tan(dipDeg * DEG) * Math.sin(l)) * RAD);
}

/**
 * First-order static error (reading − magnetic heading) [deg] for any horizontal acceleration and heading:
 * error ≈ −tan μ · a_E / (g − a_D), a_E the east component of the kinematic acceleration in the magnetic frame,
 * a_D its down component [m/s²]. Good to ~3 % of the error up to 0.1 g (dip 65: −12.3 vs exact −12.0).
 */
// Source: PHYSICS.md §1.2 "first-order unified rule" (derived: card tilt k_E = −a_E/(g − a_D)).
export function firstOrderErrorDeg(dipDeg: number, accEastMagMs2: number, accDownMs2 = 0, gMs2 = 9.80665): number {
  return -Math.tan(dipDeg * DEG) * (accEastMagMs2 / (gMs2 - accDownMs2)) * RAD;
}

/** Static turning error (reading − ψm) [deg, (−180, 180]] in a steady coordinated level turn; see {@link levelTurnReadingDeg}. */
// Source: Williams, "Compass Errors" (2001) eq. 2.
export function levelTurnErrorDeg(headingDegMag: number, bankDeg: number, dipDeg: number): number {
  return to180(levelTurnReadingDeg(headingDegMag, bankDeg, dipDeg) - headingDegMag);
}

/**
 * Lag (through the nearer magnetic pole) or lead (through the further) of a steady level turn exactly on N or S:
 * atan(tan μ sin φ) [deg, ≥ 0 for μ, φ ≥ 0]. Examples: (60, 15) 24.1; (65, 15) 29.0; (70, 18) 40.3.
 */
// Source: PHYSICS.md §1.2 / check 5 (derived from Williams eq. 2 at ψm = 0, 180).
export function cardinalTurnErrorDeg(dipDeg: number, bankDeg: number): number {
  return Math.atan(Math.tan(Math.abs(dipDeg) * DEG) * Math.sin(Math.abs(bankDeg) * DEG)) * RAD;
}

/**
 * Bank [deg] at which a level coordinated turn heading magnetic east (right turn; west for a left turn) puts
 * the card axis along the field, so the card has no directive force: φ = 90 − |μ|. Beyond it the card reverses.
 */
// Source: PHYSICS.md §1.4 (derived).
export function cardReversalBankDeg(dipDeg: number): number {
  return 90 - Math.abs(dipDeg);
}

/**
 * Largest |turning error| over all headings of a steady level turn at bank φ and dip μ, and the heading where it
 * occurs (golden-section search on each half of the compass rose, then the larger). Right turn for φ > 0.
 * Returns { errorDeg (signed), headingDegMag }. Examples: dip 55 bank 15 → −22.6 at ~027; dip 65 bank 20 → −51.4 near 054.
 */
// Method: bracketed golden-section search of Williams eq. 2 (PHYSICS.md §1.2, check 3–4).
export function maxTurningError(bankDeg: number, dipDeg: number): { errorDeg: number; headingDegMag: number } {
  const f = (h: number) => Math.abs(levelTurnErrorDeg(h, bankDeg, dipDeg));
  let bestH = 0;
  let bestE = -1;
  // Coarse scan at 1° then golden-section refinement around the best cell.
  for (let h = 0; h < 360; h += 1) {
    const e = f(h);
    if (e > bestE) { bestE = e; bestH = h; }
  }
  let a = bestH - 1, b = bestH + 1;
  const gr = (Math.sqrt(5) - 1) / 2;
  let c = b - gr * (b - a), d = a + gr * (b - a);
  for (let i = 0; i < 80; i++) {
    if (f(c) > f(d)) b = d; else a = c;
    c = b - gr * (b - a);
    d = a + gr * (b - a);
  }
  const h = to360((a + b) / 2);
  return { errorDeg: levelTurnErrorDeg(h, bankDeg, dipDeg), headingDegMag: h };
}
