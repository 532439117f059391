/**
 * Mutated input files for the fuzz checks, built with fast-check (npm `fast-check`, a
 * property-based testing library) from the committed fixtures. A mutation works on what the
 * file is made of: bytes (flip, cut, repeat a slice), lines (drop, repeat, swap, insert blank or
 * comment lines), numbers (replace one by an extreme or malformed value) and, for Matrix Market
 * files, the size line (declared sizes far larger or smaller than the entries). Any of them may
 * then be gzipped, as `.mtx.gz` files are read transparently.
 */
import fc from 'fast-check';
import { gzipSync } from 'node:zlib';

export type InputKind = 'matrix' | 'dofmap' | 'config';

export interface MutatedInput {
  kind: InputKind;
  /** Which seed file it came from. */
  seed: string;
  /** A short description of the mutations, for a failure message. */
  steps: string[];
  bytes: Uint8Array;
  gzipped: boolean;
}

/** Values that have broken number readers elsewhere: overflow, underflow, signs, malformed forms. */
const NASTY_NUMBERS = [
  '0', '-0', '1e308', '1e309', '-1e309', '4.9e-324', '1e-400', 'NaN', 'nan', 'inf', '-Infinity', '1e', '1e+',
  '.', '-', '+', '0x10', '1,5', '١', '9'.repeat(40), '-2147483649', '2147483648', '4294967297', '1000000000',
  '1e9', '3.', '.5', '1d3', '1E-2', '--1', '1 2', '',
];

type Mutation = (lines: string[], rand: () => number) => { lines: string[]; step: string };

const pick = <T>(xs: readonly T[], rand: () => number): T => xs[Math.floor(rand() * xs.length) % xs.length];
const at = (lines: string[], rand: () => number): number => Math.floor(rand() * Math.max(1, lines.length));

const lineMutations: Mutation[] = [
  (l, r) => { const i = at(l, r); return { lines: l.filter((_, k) => k !== i), step: `drop line ${i + 1}` }; },
  (l, r) => { const i = at(l, r); const n = 1 + Math.floor(r() * 50); return { lines: [...l.slice(0, i), ...Array(n).fill(l[i] ?? ''), ...l.slice(i)], step: `repeat line ${i + 1} ×${n}` }; },
  (l, r) => { const i = at(l, r); const j = at(l, r); const c = l.slice(); [c[i], c[j]] = [c[j], c[i]]; return { lines: c, step: `swap lines ${i + 1},${j + 1}` }; },
  (l, r) => { const i = at(l, r); const n = 1 + Math.floor(r() * 200); return { lines: [...l.slice(0, i), ...Array(n).fill(pick(['', '   ', '%', '% comment', '#', '\t'], r)), ...l.slice(i)], step: `insert ${n} blank/comment lines at ${i + 1}` }; },
  (l, r) => {
    // replace one whitespace- or comma-separated token by a nasty number
    const i = at(l, r);
    const parts = (l[i] ?? '').split(/([\s,]+)/);
    const tokens = parts.map((p, k) => (k % 2 === 0 ? k : -1)).filter((k) => k >= 0);
    if (tokens.length === 0) return { lines: l, step: 'no-op' };
    const k = pick(tokens, r);
    const v = pick(NASTY_NUMBERS, r);
    parts[k] = v;
    const c = l.slice();
    c[i] = parts.join('');
    return { lines: c, step: `token ${k / 2} of line ${i + 1} → "${v}"` };
  },
  (l, r) => { const n = Math.floor(r() * l.length); return { lines: l.slice(0, n), step: `truncate to ${n} lines` }; },
];

/** The first non-comment line of a Matrix Market file is its size line. */
function sizeLineIndex(lines: string[]): number {
  for (let i = 1; i < lines.length; i++) if (!lines[i].startsWith('%') && lines[i].trim() !== '') return i;
  return -1;
}

const matrixMutations: Mutation[] = [
  (l, r) => {
    const i = sizeLineIndex(l);
    if (i < 0) return { lines: l, step: 'no-op' };
    const sizes = ['1000000000 1000000000 3', '2000000 2000000 3', '3 3 1000000000', '100000 100000 4', '3 4 4', '0 0 0', '3 3', '3 3 4 5', '-3 -3 4', '3 3 -1'];
    const v = pick(sizes, r);
    const c = l.slice();
    c[i] = v;
    return { lines: c, step: `size line → "${v}"` };
  },
  (l, r) => {
    // a huge declared size that agrees with the number of entries that follow
    const i = sizeLineIndex(l);
    if (i < 0) return { lines: l, step: 'no-op' };
    const entries = l.slice(i + 1).filter((x) => x.trim() !== '' && !x.startsWith('%')).length;
    const n = pick([1e9, 2 ** 31 - 1, 5e7, 3e6], r);
    const c = l.slice();
    c[i] = `${n} ${n} ${entries}`;
    return { lines: c, step: `size line → "${c[i]}"` };
  },
  (l, r) => {
    const c = l.slice();
    const banners = ['%%MatrixMarket matrix coordinate real general', '%%MatrixMarket matrix array real symmetric', '%%MatrixMarket matrix coordinate pattern symmetric', '%%matrixmarket MATRIX Coordinate Real Symmetric', '%MatrixMarket matrix coordinate real symmetric', '%%MatrixMarket vector coordinate real general', ''];
    c[0] = pick(banners, r);
    return { lines: c, step: `banner → "${c[0]}"` };
  },
];

function mutateBytes(bytes: Uint8Array, rand: () => number): { bytes: Uint8Array; step: string } {
  const b = Uint8Array.from(bytes);
  const choice = Math.floor(rand() * 3);
  if (choice === 0 && b.length > 0) {
    const i = Math.floor(rand() * b.length);
    b[i] = Math.floor(rand() * 256);
    return { bytes: b, step: `byte ${i} → ${b[i]}` };
  }
  if (choice === 1 && b.length > 0) {
    const i = Math.floor(rand() * b.length);
    return { bytes: b.subarray(0, i), step: `cut at byte ${i}` };
  }
  const i = Math.floor(rand() * (b.length + 1));
  const len = Math.min(b.length - i, 1 + Math.floor(rand() * 64));
  const times = 1 + Math.floor(rand() * 100);
  const slice = b.subarray(i, i + Math.max(0, len));
  const out = new Uint8Array(b.length + slice.length * times);
  out.set(b.subarray(0, i), 0);
  for (let t = 0; t < times; t++) out.set(slice, i + t * slice.length);
  out.set(b.subarray(i), i + slice.length * times);
  return { bytes: out, step: `repeat ${slice.length} bytes at ${i} ×${times}` };
}

/** A fast-check arbitrary of mutated inputs of one kind from the given seed files (name → text). */
export function mutatedInputs(kind: InputKind, seeds: Record<string, string>): fc.Arbitrary<MutatedInput> {
  const names = Object.keys(seeds);
  return fc
    .record({
      seed: fc.constantFrom(...names),
      randomSeed: fc.integer({ min: 1, max: 2 ** 31 - 1 }),
      count: fc.integer({ min: 1, max: 4 }),
      bytewise: fc.boolean(),
      gzip: fc.boolean(),
    })
    .map(({ seed, randomSeed, count, bytewise, gzip }) => {
      let s = randomSeed;
      // xorshift32: the mutation's own choices follow from fast-check's seed
      const rand = (): number => {
        s ^= s << 13;
        s ^= s >>> 17;
        s ^= s << 5;
        return (s >>> 0) / 2 ** 32;
      };
      const steps: string[] = [];
      let lines = seeds[seed].split('\n');
      const pool = kind === 'matrix' ? [...lineMutations, ...matrixMutations] : lineMutations;
      for (let k = 0; k < count; k++) {
        const m = pick(pool, rand)(lines, rand);
        lines = m.lines;
        steps.push(m.step);
      }
      let bytes: Uint8Array = new TextEncoder().encode(lines.join('\n'));
      if (bytewise) {
        const m = mutateBytes(bytes, rand);
        bytes = m.bytes;
        steps.push(m.step);
      }
      const gzipped = gzip && kind === 'matrix';
      if (gzipped) bytes = gzipSync(bytes);
      return { kind, seed, steps, bytes, gzipped };
    });
}
