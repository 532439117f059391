/**
 * Node fingerprint files of a baseline (`<model>.<run>.nodes.csv.gz`): header
 * `node,stiffness,mass`, one line per node, each fingerprint 16 hex digits (two 32-bit lanes).
 * What the fingerprints mean is in src/model/change-map.ts; this module only writes and reads
 * them (atomically; gzip detected on reading).
 */
import { readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { batchLines, writeChunksAtomic } from './atomic-stream-write.js';
import { InputError } from './errors.js';

export interface FingerprintTable {
  nodes: Int32Array;
  /** Two lanes per node. */
  stiffness: Uint32Array;
  mass: Uint32Array;
}

const HEADER = 'node,stiffness,mass';

export async function writeNodeFingerprints(path: string, t: FingerprintTable): Promise<void> {
  const hex = (a: Uint32Array, k: number): string => a[2 * k].toString(16).padStart(8, '0') + a[2 * k + 1].toString(16).padStart(8, '0');
  function* lines(): Generator<string> {
    yield `${HEADER}\n`;
    for (let k = 0; k < t.nodes.length; k++) yield `${t.nodes[k]},${hex(t.stiffness, k)},${hex(t.mass, k)}\n`;
  }
  await writeChunksAtomic(path, batchLines(lines()), { gzip: true });
}

export function readNodeFingerprints(path: string): FingerprintTable {
  let bytes = readFileSync(path);
  if (bytes[0] === 0x1f && bytes[1] === 0x8b) bytes = gunzipSync(bytes);
  const lines = bytes.toString('utf8').split('\n').filter((l) => l.length > 0);
  if (lines[0] !== HEADER) throw new InputError(path, `is not a node fingerprint file (first line is not "${HEADER}")`, { line: 1 });
  const count = lines.length - 1;
  const t: FingerprintTable = { nodes: new Int32Array(count), stiffness: new Uint32Array(2 * count), mass: new Uint32Array(2 * count) };
  const lane = (s: string, at: number): number => parseInt(s.slice(at, at + 8), 16);
  // node id and the two 16-digit fingerprints per line
  for (let k = 0; k < count; k++) {
    const parts = lines[k + 1].split(',');
    const ok = parts.length === 3 && /^\d+$/.test(parts[0]) && /^[0-9a-f]{16}$/.test(parts[1]) && /^[0-9a-f]{16}$/.test(parts[2]);
    if (!ok) throw new InputError(path, 'expected "node,<16 hex digits>,<16 hex digits>"', { line: k + 2 });
    t.nodes[k] = Number(parts[0]);
    t.stiffness[2 * k] = lane(parts[1], 0);
    t.stiffness[2 * k + 1] = lane(parts[1], 8);
    t.mass[2 * k] = lane(parts[2], 0);
    t.mass[2 * k + 1] = lane(parts[2], 8);
  }
  return t;
}
