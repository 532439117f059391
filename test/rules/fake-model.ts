/**
 * Small hand-built models for rule tests: a spring–mass chain (springs k between neighbours,
 * lumped masses m_i), its exact modes from a general-purpose dense eigen-solver (ml-matrix), and
 * a ModesResult / MatrixSummary around them — so rules are tested before the readers and the
 * sparse solver exist, and against something outside the project.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { TripletList, assembleSymmetric } from '../../src/sparse/assemble.js';
import type { SymmetricCsc } from '../../src/sparse/csc.js';
import type { ModesResult } from '../../src/eigen/modes-types.js';
import { frequencyHzFromEigenvalue } from '../../src/eigen/modes-types.js';
import type { MatrixSummary } from '../../src/io/matrix-summary.js';
import type { RuleContext } from '../../src/rules/rule-types.js';
import type { DofMap } from '../../src/io/dof-map.js';

export interface Chain {
  stiffness: SymmetricCsc;
  mass: SymmetricCsc;
  denseK: number[][];
  masses: number[];
}

/** n masses in a line joined by n−1 springs k; `groundSpring` adds k to ground at DOF 0 (fixed–free). */
export function springChain(n: number, k: number, masses: number[], groundSpring = 0): Chain {
  const denseK = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  // K = Σ springs k (e_i − e_{i+1})(e_i − e_{i+1})ᵀ (+ ground spring at DOF 0)
  for (let i = 0; i + 1 < n; i++) {
    denseK[i][i] += k;
    denseK[i + 1][i + 1] += k;
    denseK[i][i + 1] -= k;
    denseK[i + 1][i] -= k;
  }
  denseK[0][0] += groundSpring;
  return { stiffness: sparseFromDense(denseK), mass: sparseFromDense(masses.map((m, i) => masses.map((_, j) => (i === j ? m : 0)))), denseK, masses };
}

export function sparseFromDense(a: number[][]): SymmetricCsc {
  const t = new TripletList();
  for (let j = 0; j < a.length; j++) for (let i = j; i < a.length; i++) if (a[i][j] !== 0) t.push(i, j, a[i][j]);
  return assembleSymmetric(a.length, t).matrix;
}

/** Exact modes of K φ = λ M φ for diagonal M via the symmetric M^{-1/2} K M^{-1/2} (ml-matrix). */
export function exactModes(chain: Chain, count = chain.masses.length): ModesResult {
  const n = chain.masses.length;
  const s = chain.masses.map((m) => 1 / Math.sqrt(m));
  const a = new Matrix(chain.denseK.map((row, i) => row.map((v, j) => v * s[i] * s[j])));
  const eig = new EigenvalueDecomposition(a, { assumeSymmetric: true });
  const order = eig.realEigenvalues.map((v, i) => [v, i]).sort((x, y) => x[0] - y[0]);
  const eigenvalues = new Float64Array(count);
  const shapes = new Float64Array(n * count);
  // φ = M^{-1/2} v for each of the lowest eigenvectors v (unit length → unit modal mass)
  for (let c = 0; c < count; c++) {
    const [lambda, idx] = order[c];
    eigenvalues[c] = lambda;
    for (let r = 0; r < n; r++) shapes[c * n + r] = s[r] * eig.eigenvectorMatrix.get(r, idx);
  }
  return fakeModes(n, eigenvalues, shapes);
}

/** A ModesResult around given eigenvalues and shapes; solver figures are plausible defaults. */
export function fakeModes(n: number, eigenvalues: Float64Array, shapes = new Float64Array(n * eigenvalues.length)): ModesResult {
  const m = eigenvalues.length;
  return {
    n,
    eigenvalues,
    frequenciesHz: eigenvalues.map(frequencyHzFromEigenvalue),
    shapes,
    residuals: new Float64Array(m).fill(1e-14),
    sturm: { shift: m > 0 ? eigenvalues[m - 1] * 1.01 + 1 : 0, countBelow: m, modesReturned: m, ok: true },
    orthogonality: { massMaxDeviation: 1e-15, stiffnessMaxDeviation: 1e-15 },
    method: 'lanczos',
    shifts: [-1],
    iterations: 3,
    timings: { totalMs: 1, factorMs: 0.5, iterateMs: 0.3, verifyMs: 0.2 },
    factor: {
      ordering: 'amd',
      n,
      nnzL: 2 * n,
      flops: 10 * n,
      supernodes: n,
      timings: { orderingMs: 0, symbolicMs: 0, numericMs: 0 },
      factorBytes: 100,
      maxDiagonalToPivotRatio: 12,
      maxRatioDof: 0,
      tinyPivots: [],
    },
    warnings: [],
  };
}

/** Modes with the given frequencies (Hz) and zero shapes — for rules that read frequencies only. */
export function modesWithFrequencies(hz: number[]): ModesResult {
  const lambda = Float64Array.from(hz, (f) => Math.sign(f) * (2 * Math.PI * f) ** 2);
  const modes = fakeModes(1, lambda);
  modes.frequenciesHz = Float64Array.from(hz);
  return modes;
}

export function cleanSummary(file: string, n: number, overrides: Partial<MatrixSummary> = {}): MatrixSummary {
  return {
    file,
    format: 'coordinate',
    field: 'real',
    symmetry: 'symmetric',
    n,
    entriesInFile: n,
    storedNonzeros: n,
    fullNonzeros: n,
    duplicatesSummed: 0,
    maxRelativeAsymmetry: 0,
    asymmetryAt: null,
    nonFiniteCount: 0,
    diagonalMin: 1,
    diagonalMax: 1,
    diagonalSpread: 1,
    zeroDiagonalCount: 0,
    zeroDiagonalDofs: [],
    negativeDiagonalCount: 0,
    negativeDiagonalDofs: [],
    bandwidth: 1,
    maxAbsEntry: 1,
    listCap: 20,
    ...overrides,
  };
}

export function chainContext(chain: Chain, modes?: ModesResult, dofMap?: DofMap): RuleContext {
  const n = chain.masses.length;
  return {
    modelName: 'chain',
    stiffness: chain.stiffness,
    mass: chain.mass,
    stiffnessSummary: cleanSummary('K.mtx', n),
    massSummary: cleanSummary('M.mtx', n),
    dofMap,
    modes,
  };
}

/** A DOF map: one node per 3 DOFs (ux, uy, uz), nodes numbered from 1 along x. */
export function lineDofMap(n: number): DofMap {
  const node = new Int32Array(n);
  const component = new Uint8Array(n);
  const x = new Float64Array(n);
  // DOF i belongs to node ⌊i/3⌋+1, component i mod 3
  for (let i = 0; i < n; i++) {
    node[i] = Math.floor(i / 3) + 1;
    component[i] = i % 3;
    x[i] = Math.floor(i / 3);
  }
  return { n, node, component, x, y: new Float64Array(n), z: new Float64Array(n) };
}
