/**
 * Seeded pseudo-random numbers for the tolerance spread: the same seed gives the same
 * samples on every machine and in every JavaScript engine (only 32-bit integer arithmetic).
 *
 * Generator: mulberry32 (Tommy Ettinger, 2017, public domain; from memory) — a 32-bit state
 * advanced by the Weyl constant 0x6D2B79F5 and mixed by two multiply-xorshift rounds. Its
 * period is 2³², ample for 100,000 samples of ten draws each. Normal deviates by the
 * Box–Muller transform (Box & Muller, Ann. Math. Statist. 29, 1958), both values used.
 */

export interface Random {
  /** Uniform on [0, 1). */
  next(): number;
  /** Standard normal N(0, 1). */
  normal(): number;
}

/** A generator seeded with any integer (taken modulo 2³²). */
export const createRandom = (seed: number): Random => {
  let state = seed >>> 0;
  let spare: number | null = null;
  const next = (): number => {
    state = (state + 0x6d2b79f5) | 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const normal = (): number => {
    if (spare !== null) {
      const z = spare;
      spare = null;
      return z;
    }
    // 1 − u keeps the logarithm's argument in (0, 1].
    const r = Math.sqrt(-2 * Math.log(1 - next()));
    const a = 2 * Math.PI * next();
    spare = r * Math.sin(a);
    return r * Math.cos(a);
  };
  return { next, normal };
};
