// Seeded pseudo-random numbers for the synthetic logs: reproducible across runs and platforms.

/**
 * Uniform numbers in [0, 1) from a 32-bit seed. Method: mulberry32 (T. Ettinger, public domain; a 32-bit
 * counter passed through an integer mixing function, period 2³²). Fine for test noise, not for cryptography.
 * The state lives in the returned closure only.
 */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * Standard normal deviates (mean 0, sigma 1) from a seed. Method: Box–Muller transform
 * (G. E. P. Box, M. E. Muller, Ann. Math. Statist. 29(2):610-611, 1958): z₀ = √(−2 ln u₁) cos 2πu₂,
 * z₁ = √(−2 ln u₁) sin 2πu₂; both are used, in that order. u₁ is taken in (0, 1] so the log stays finite.
 */
export function seededNormal(seed: number): () => number {
  const uniform = mulberry32(seed);
  let spare = NaN;
  return () => {
    if (Number.isFinite(spare)) {
      const z = spare;
      spare = NaN;
      return z;
    }
    const u1 = 1 - uniform();
    const u2 = uniform();
    const r = Math.sqrt(-2 * Math.log(u1));
    spare = r * Math.sin(2 * Math.PI * u2);
    return r * Math.cos(2 * Math.PI * u2);
  };
}
