// A small seeded random generator, so invented logs and sampling designs give the same numbers on every machine:
// mulberry32 (a 32-bit state, full period 2^32) for uniform draws, Box and Muller (1958) for Gaussian ones.

/** Seeded generator (mulberry32: 32-bit state, full period), and Gaussian draws by Box and Muller (1958). */
export function seededRandom(seed: number): { uniform: () => number; gaussian: () => number } {
  let state = seed >>> 0;
  const uniform = () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const gaussian = () => {
    const u = Math.max(1e-12, uniform());
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * uniform());
  };
  return { uniform, gaussian };
}
