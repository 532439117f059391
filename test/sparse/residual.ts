/** Residual measures for the sparse tests: ‖(K − σM)x − b‖∞ / (‖K − σM‖∞ ‖x‖∞). */
import { symMultiply, type SymmetricCsc } from '../../src/sparse/csc.js';

/** ‖A‖∞ of the full symmetric matrix stored as its lower triangle (max absolute row sum). */
export function infNorm(a: SymmetricCsc): number {
  const rows = new Float64Array(a.n);
  for (let j = 0; j < a.n; j++)
    for (let p = a.colPtr[j]; p < a.colPtr[j + 1]; p++) {
      const i = a.rowIdx[p];
      const v = Math.abs(a.values[p]);
      rows[i] += v;
      if (i !== j) rows[j] += v;
    }
  return rows.reduce((m, v) => Math.max(m, v), 0);
}

export function shiftedResidual(k: SymmetricCsc, m: SymmetricCsc, shift: number, x: Float64Array, b: Float64Array): number {
  const kx = symMultiply(k, x);
  const mx = symMultiply(m, x);
  let r = 0;
  let xn = 0;
  for (let i = 0; i < k.n; i++) {
    r = Math.max(r, Math.abs(kx[i] - shift * mx[i] - b[i]));
    xn = Math.max(xn, Math.abs(x[i]));
  }
  // ‖K − σM‖∞ ≤ ‖K‖∞ + |σ|‖M‖∞ (upper bound used as the scale)
  return r / ((infNorm(k) + Math.abs(shift) * infNorm(m)) * xn);
}
