/**
 * The hand-assembled WebAssembly modules as text: each module's bytes are disassembled with
 * wabt (the WebAssembly Binary Toolkit's own reader and printer, built for npm) and compared
 * with the committed `.wat` files under test/sparse/wasm/, so a change to the assembler shows
 * in review as a text diff. After an intended change: `npx vitest run test/sparse/wasm-modules -u`.
 */
import { describe, expect, it } from 'vitest';
import { sweepModuleBytes } from '../../src/sparse/simd-sweep-kernels.js';
import { tileModuleBytes } from '../../src/sparse/wasm-tile-kernel.js';

interface Wabt {
  readWasm(bytes: Uint8Array, options: { simd: boolean; threads: boolean }): { toText(options: { foldExprs?: boolean; inlineExport?: boolean }): string; destroy(): void };
}

/**
 * wabt (npm `wabt`, a devDependency); named through a variable so the type check passes before
 * it is installed, and the test is skipped with a warning where it is missing.
 */
const wabtPackage = 'wabt';
const wabt = await import(wabtPackage).then((m: { default: () => Promise<Wabt> }) => m.default).catch(() => null);
if (wabt === null) console.warn('WebAssembly text snapshots skipped: the wabt package is not installed');

/** wabt's text form of `bytes` (validated on reading: SIMD and shared memory enabled). */
async function disassemble(bytes: Uint8Array): Promise<string> {
  const mod = (await wabt!()).readWasm(bytes, { simd: true, threads: true });
  try {
    return mod.toText({ foldExprs: false, inlineExport: false });
  } finally {
    mod.destroy();
  }
}

describe.skipIf(wabt === null)('hand-assembled WebAssembly modules', () => {
  it('the tile kernel module disassembles to the committed text', async () => {
    await expect(await disassemble(tileModuleBytes())).toMatchFileSnapshot('./wasm/tile-kernel.wat');
  });

  it('the sweep kernel module disassembles to the committed text', async () => {
    await expect(await disassemble(sweepModuleBytes())).toMatchFileSnapshot('./wasm/sweep-kernels.wat');
  });
});
