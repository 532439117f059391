/**
 * One residual measure: the eigenpair residual ‖Kφ − λMφ‖ / (‖Kφ‖ + |λ|‖Mφ‖) (rigid-body floor,
 * src/eigen/residual-measure.ts) is what the solver converges on, what `modes` prints and what
 * the eigen-residual rule reads — formed once by the verification and carried in the result.
 *
 * Reference: exact modes of a spring–mass chain from ml-matrix's dense symmetric eigen-solver
 * (test/rules/fake-model.ts), outside the project; the contaminated mode is built from them.
 */
import { describe, expect, it } from 'vitest';
import { Matrix } from 'ml-matrix';
import { chainContext, exactModes, fakeModes, springChain } from './fake-model.js';
import { eigenResidual } from '../../src/rules/eigen-residual.js';
import { modalProducts } from '../../src/rules/utils/modal-products.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import { symMultiplyBlock, symOneNorm } from '../../src/sparse/csc.js';
import { readStiffnessAndMass } from '../../src/io/matrix-market-reader.js';
import { join } from 'node:path';

const masses = [2, 1, 1.5, 1, 3, 1, 1.2, 1];
const chain = springChain(masses.length, 1000, masses, 1000); // fixed–free: no rigid-body mode
const options = { tolerance: eigenResidual.defaults.tolerance };

/** φ₁ with a share `c` of φ₂ mixed in, M-normalized, with its Rayleigh quotient as eigenvalue. */
function contaminated(c: number) {
  const exact = exactModes(chain, 3);
  const n = masses.length;
  const shapes = exact.shapes.slice();
  // φ₁ ← φ₁ + c φ₂, then φ₁ ← φ₁ / √(φ₁ᵀMφ₁)
  for (let r = 0; r < n; r++) shapes[r] += c * exact.shapes[n + r];
  let m = 0;
  for (let r = 0; r < n; r++) m += masses[r] * shapes[r] * shapes[r];
  for (let r = 0; r < n; r++) shapes[r] /= Math.sqrt(m);
  // λ₁ ← φ₁ᵀKφ₁ (unit modal mass): the Rayleigh quotient, dense with ml-matrix
  const phi = Matrix.columnVector(Array.from(shapes.subarray(0, n)));
  const lambda = phi.transpose().mmul(new Matrix(chain.denseK)).mmul(phi).get(0, 0);
  const eigenvalues = exact.eigenvalues.slice();
  eigenvalues[0] = lambda;
  return { modes: fakeModes(n, eigenvalues, shapes), exact };
}

describe('eigen-residual reads the one eigenpair residual', () => {
  it('a mode with 30 % of mode 2 mixed in fails, with the measure named in the message and the JSON details', () => {
    const { modes, exact } = contaminated(0.3);
    const off = Math.sqrt(modes.eigenvalues[0] / exact.eigenvalues[0]) - 1;
    expect(off).toBeGreaterThan(0.05); // the frequency is visibly wrong
    const o = eigenResidual.evaluate(chainContext(chain, modes), options);
    expect(o.status).toBe('fail');
    expect(o.message).toMatch(/^mode 1 \(.* Hz\) has eigenpair residual ‖Kφ − λMφ‖ \/ \(‖Kφ‖ \+ \|λ\|‖Mφ‖\) = .*, above 1\.00e-8: the pair does not satisfy Kφ = λMφ\.$/);
    expect(o.details?.measure).toBe('eigenpair residual');
    const r = o.details?.relativeResiduals as number[];
    expect(r[0]).toBeGreaterThan(0.01);
    expect(Math.max(r[1], r[2])).toBeLessThan(1e-12);
    // the JSON document of the outcome carries the measured value and the per-mode list
    const json = JSON.parse(JSON.stringify(o));
    expect(json.measured).toBeCloseTo(r[0], 15);
    expect(json.details.relativeResiduals).toHaveLength(3);
  });

  it('the exact modes (ml-matrix) pass', () => {
    const o = eigenResidual.evaluate(chainContext(chain, exactModes(chain, 4)), options);
    expect(o.status).toBe('pass');
    expect(o.message).toMatch(/^largest eigenpair residual .* \(mode \d\), within 1\.00e-8\.$/);
  });

  it("a clean solve passes, and the rule reads the solver's residuals and projections instead of forming its own", () => {
    const modes = solveModes(chain.stiffness, chain.mass, { count: 4 });
    expect(modes.projections).toBeDefined();
    const p = modalProducts(chain.stiffness, chain.mass, modes);
    expect(p.relativeResiduals).toBe(modes.residuals);
    expect(p.massProjected).toBe(modes.projections!.mass);
    // the same number computed here directly from K, M and the shapes
    const n = masses.length;
    const kPhi = symMultiplyBlock(chain.stiffness, modes.shapes, 4);
    const mPhi = symMultiplyBlock(chain.mass, modes.shapes, 4);
    for (let j = 0; j < 4; j++) {
      let rr = 0;
      let kk = 0;
      let mm = 0;
      for (let r = j * n; r < (j + 1) * n; r++) {
        rr += (kPhi[r] - modes.eigenvalues[j] * mPhi[r]) ** 2;
        kk += kPhi[r] ** 2;
        mm += mPhi[r] ** 2;
      }
      const rho = Math.sqrt(rr) / (Math.sqrt(kk) + Math.abs(modes.eigenvalues[j]) * Math.sqrt(mm));
      expect(Math.abs(modes.residuals[j] - rho)).toBeLessThanOrEqual(1e-3 * rho + 1e-17);
    }
    const o = eigenResidual.evaluate(chainContext(chain, modes), options);
    expect(o.status).toBe('pass');
    // eigenvalues against ml-matrix dense
    exactModes(chain, 4).eigenvalues.forEach((l, i) => expect(Math.abs(modes.eigenvalues[i] - l)).toBeLessThanOrEqual(1e-10 * l));
  });

  it('on the demo mast the ratio with ‖K‖₁‖φ‖ (the former measure) is 1e5 smaller than the eigenpair residual of a contaminated mode', async () => {
    const demo = join(import.meta.dirname, '../../fixtures/demo');
    const pair = await readStiffnessAndMass(join(demo, 'mast.stiffness.mtx'), join(demo, 'mast.mass.mtx'));
    const k = pair.stiffness.matrix;
    const m = pair.mass.matrix;
    const solved = solveModes(k, m, { count: 4 });
    const n = k.n;
    const shapes = solved.shapes.slice(0, 3 * n);
    // φ₁ ← (φ₁ + 0.3 φ₃)/√1.09 (M-orthonormal modes: unit modal mass again), λ₁ its Rayleigh quotient
    for (let r = 0; r < n; r++) shapes[r] = (shapes[r] + 0.3 * solved.shapes[2 * n + r]) / Math.sqrt(1.09);
    const eigenvalues = solved.eigenvalues.slice(0, 3);
    eigenvalues[0] = (solved.eigenvalues[0] + 0.09 * solved.eigenvalues[2]) / 1.09;
    const modes = fakeModes(n, eigenvalues, shapes);
    const kPhi = symMultiplyBlock(k, shapes, 1);
    const mPhi = symMultiplyBlock(m, shapes, 1);
    let rr = 0;
    let pp = 0;
    for (let r = 0; r < n; r++) {
      rr += (kPhi[r] - eigenvalues[0] * mPhi[r]) ** 2;
      pp += shapes[r] ** 2;
    }
    const former = Math.sqrt(rr) / ((symOneNorm(k) + eigenvalues[0] * symOneNorm(m)) * Math.sqrt(pp));
    // about 3e-6 here: the stiff members' ‖K‖₁ hides an imbalance of a quarter of the forces
    expect(former).toBeLessThan(1e-5);
    const context = { ...chainContext(chain), stiffness: k, mass: m, modes };
    const o = eigenResidual.evaluate(context, options);
    expect(o.status).toBe('fail');
    expect((o.details?.relativeResiduals as number[])[0]).toBeGreaterThan(0.1);
    expect((o.details?.relativeResiduals as number[])[0]).toBeGreaterThan(1e4 * former);
  }, 60_000);
});
