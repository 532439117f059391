/**
 * A small deterministic generator of uniform numbers in [0, 1): mulberry32 (a 32-bit counter
 * through an integer mixing function; public-domain construction, from memory). Not for
 * statistics — only so that random start vectors and test matrices repeat exactly run to run.
 */
export function seededUniform(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
