/**
 * The hand-assembled WebAssembly modules (src/sparse, src/dense) as text: each module's bytes are disassembled with
 * wabt (the WebAssembly Binary Toolkit's own reader and printer, built for npm) and compared
 * with the committed `.wat` files under test/sparse/wasm/, so a change to the assembler shows
 * in review as a text diff. After an intended change: `npx vitest run test/sparse/wasm-modules -u`.
 */
import { describe, expect, it } from 'vitest';
import wabt from 'wabt';
import { sweepModuleBytes } from '../../src/sparse/simd-sweep-kernels.js';
import { tileModuleBytes } from '../../src/sparse/wasm-tile-kernel.js';
import { symProductModuleBytes } from '../../src/sparse/sym-product-kernel.js';
import { blockModuleBytes } from '../../src/dense/simd-block-kernels.js';

/** wabt (npm `wabt`, the WebAssembly Binary Toolkit built for npm; a devDependency). */
/** wabt's text form of `bytes` (validated on reading: SIMD and shared memory enabled). */
async function disassemble(bytes: Uint8Array): Promise<string> {
  const mod = (await wabt()).readWasm(bytes, { simd: true, threads: true });
  try {
    return mod.toText({ foldExprs: false, inlineExport: false });
  } finally {
    mod.destroy();
  }
}

describe('hand-assembled WebAssembly modules', () => {
  it('the tile kernel module disassembles to the committed text', async () => {
    await expect(await disassemble(tileModuleBytes())).toMatchFileSnapshot('./wasm/tile-kernel.wat');
  });

  it('the sweep kernel module disassembles to the committed text', async () => {
    await expect(await disassemble(sweepModuleBytes())).toMatchFileSnapshot('./wasm/sweep-kernels.wat');
  });

  it('the symmetric product kernel module disassembles to the committed text', async () => {
    await expect(await disassemble(symProductModuleBytes())).toMatchFileSnapshot('./wasm/sym-product-kernel.wat');
  });

  it('the basis-product kernel module (src/dense) disassembles to the committed text', async () => {
    await expect(await disassemble(blockModuleBytes())).toMatchFileSnapshot('./wasm/block-kernels.wat');
  });
});
