// Seeded random numbers for the simulation tests, so every run draws the same cases.

/** Deterministic uniform generator on [0, 1) (mulberry32, a 32-bit public-domain generator). */
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

/** A standard normal draw from a uniform generator (Box–Muller, the cosine half). */
export function normalDraw(uniform: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

/** A binomial draw by counting successes (fine for the few hundred trials of a tray). */
export function binomialDraw(uniform: () => number, n: number, p: number): number {
  let x = 0;
  for (let i = 0; i < n; i++) if (uniform() < p) x++;
  return x;
}
