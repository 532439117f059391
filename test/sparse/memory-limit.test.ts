/**
 * The memory prediction made from the symbolic analysis, against what a factorization then holds
 * (the factor's own byte count), and the refusal before numeric work when a limit is set.
 */
import { describe, expect, it } from 'vitest';
import { createShiftedSolver } from '../../src/sparse/shifted-solver.js';
import { MemoryLimitError } from '../../src/sparse/memory-limit.js';
import { hexGridPair } from './fe-like-matrices.js';

describe('memory limit of a solve', () => {
  const { stiffness, mass } = hexGridPair(8, 7, 6, 3);

  it('predicts at least what the factor holds, and not wildly more', () => {
    const solver = createShiftedSolver(stiffness, mass, { threads: 1, memoryLimitBytes: 1e12 });
    const f = solver.factor(-1);
    const held = f.diagnostics.factorBytes;
    expect(held).toBeGreaterThan(0);
    // the prediction counts the factor's values, D and row indices, plus scratch
    let refused: MemoryLimitError | undefined;
    try {
      createShiftedSolver(stiffness, mass, { threads: 1, memoryLimitBytes: held * 0.9 });
    } catch (e) {
      if (e instanceof MemoryLimitError) refused = e;
      else throw e;
    }
    expect(refused).toBeDefined();
    expect(refused!.predictedBytes).toBeGreaterThanOrEqual(held * 0.9);
    expect(refused!.predictedBytes).toBeLessThan(held * 3);
    expect(refused!.message).toMatch(/would need about .* above the memory limit of .* \(--max-memory\)/);
  });

  it('counts what the caller keeps beside the factor', () => {
    expect(() => createShiftedSolver(stiffness, mass, { threads: 1, memoryLimitBytes: 1e9, extraBytes: 2e9 })).toThrow(MemoryLimitError);
  });

});
