/**
 * Seeded pseudo-random numbers (xoshiro128**, seeded through splitmix32). Every random decision in
 * the engine draws from one of these, so a seed reproduces a run exactly; Math.random is never used.
 */
export interface Rng {
  /** Uniform in [0, 1). */
  next(): number;
  /** Uniform integer in [0, n). */
  int(n: number): number;
  /** Shuffles an array in place (Fisher–Yates) and returns it. */
  shuffle<T>(a: T[]): T[];
}

/** A generator for `seed`; the same seed always yields the same sequence. */
export function createRng(seed: number): Rng {
  let x = (seed | 0) ^ 0x9e3779b9;
  const split = () => {
    x = (x + 0x9e3779b9) | 0;
    let z = x;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return (z ^ (z >>> 16)) >>> 0;
  };
  let a = split(), b = split(), c = split(), d = split();
  if ((a | b | c | d) === 0) a = 1;
  const nextU32 = () => {
    const r = Math.imul(((Math.imul(b, 5) << 7) | (Math.imul(b, 5) >>> 25)), 9) >>> 0;
    const t = b << 9;
    c ^= a; d ^= b; b ^= c; a ^= d; c ^= t;
    d = (d << 11) | (d >>> 21);
    return r;
  };
  const rng: Rng = {
    next: () => nextU32() / 4294967296,
    int: (n: number) => Math.floor((nextU32() / 4294967296) * n),
    shuffle<T>(arr: T[]): T[] {
      for (let i = arr.length - 1; i > 0; i--) {
        const j = rng.int(i + 1);
        const tmp = arr[i]; arr[i] = arr[j]; arr[j] = tmp;
      }
      return arr;
    },
  };
  return rng;
}
