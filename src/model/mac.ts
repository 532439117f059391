/**
 * Modal Assurance Criterion (MAC) between two sets of mode shapes, after Allemang & Brown,
 * "A Correlation Coefficient for Modal Vector Analysis", Proc. 1st IMAC (1982) pp. 110–116
 * (definition as restated in Allemang, Sound and Vibration 37(8), 2003, eq. 4; docs/sources.md §2 [C]):
 *
 *   MAC(φ, ψ) = (φᵀ W ψ)² / ((φᵀ W φ)(ψᵀ W ψ))
 *
 * with W = I (the plain MAC) or W = M (mass-weighted: for mass-normalized modes at every DOF this
 * is the squared cross-orthogonality φᵀMψ, Coppolino ch. 3 eq. 3.32b, docs/sources.md §2 [C]).
 * Real shapes, so the conjugate transpose is the transpose. MAC lies in 0…1 and does not change
 * when either shape is scaled or flips sign.
 *
 * For near-repeated modes a single vector is arbitrary inside its eigenspace, so we also give the
 * subspace form: the share of φ's W-norm that lies in span(Ψ_C) of a group C of shapes,
 *
 *   P(φ, C) = g G⁻¹ gᵀ / (φᵀWφ),   g = φᵀ W Ψ_C,   G = Ψ_Cᵀ W Ψ_C,
 *
 * which equals MAC when C has one member (our construction, in the spirit of the SpaceMAC of
 * SEM/IMAC ch. 18, docs/sources.md §2; grouping near-repeated modes is common practice, [CP]).
 *
 * Groups are also compared whole, by the principal angles θ_1 ≤ … ≤ θ_k between span(Φ_B) and
 * span(Ψ_C) in the W inner product (Björck & Golub, "Numerical methods for computing angles
 * between linear subspaces", Math. Comp. 27 (1973) 579–594): with W-Cholesky factors of the two
 * Grams, Φ_BᵀWΦ_B = L_B L_Bᵀ and Ψ_CᵀWΨ_C = L_C L_Cᵀ, the bases Φ_B L_B⁻ᵀ and Ψ_C L_C⁻ᵀ are
 * W-orthonormal and cos θ_k are the singular values of L_B⁻¹ (Φ_BᵀWΨ_C) L_C⁻ᵀ.
 *
 * Shapes are column-major blocks (rows = compared DOFs, one column per mode).
 */
import { symMultiplyBlock, type SymmetricCsc } from '../sparse/csc.js';
import { transposeTimes } from '../dense/block-ops.js';
import { cholesky, solveLower } from '../dense/cholesky.js';
import { symmetricEigenvalues } from '../dense/symmetric-eigen.js';

/** rows × cols mode shapes, column-major (entry (i, j) at values[i + j·rows]). */
export interface ShapeBlock {
  rows: number;
  cols: number;
  values: Float64Array;
}

/** Inner products of two shape sets in the W inner product: cross (mb×mc), and each set's own Gram. */
export interface ShapeProducts {
  baselineModes: number;
  currentModes: number;
  /** ΦᵀWΨ, column-major mb × mc. */
  cross: Float64Array;
  /** ΦᵀWΦ, mb × mb. */
  baselineGram: Float64Array;
  /** ΨᵀWΨ, mc × mc. */
  currentGram: Float64Array;
}

/** The W inner products of baseline shapes Φ and current shapes Ψ (W = I when `weight` is absent). */
export function shapeProducts(baseline: ShapeBlock, current: ShapeBlock, weight?: SymmetricCsc): ShapeProducts {
  if (baseline.rows !== current.rows) throw new Error(`shapeProducts: ${baseline.rows} rows against ${current.rows}`);
  if (weight && weight.n !== baseline.rows) throw new Error(`shapeProducts: weight of order ${weight.n} for ${baseline.rows} rows`);
  const rows = baseline.rows, mb = baseline.cols, mc = current.cols;
  const wPhi = weight ? symMultiplyBlock(weight, baseline.values, mb) : baseline.values;
  const wPsi = weight ? symMultiplyBlock(weight, current.values, mc) : current.values;
  return {
    baselineModes: mb,
    currentModes: mc,
    cross: transposeTimes(wPhi, current.values, rows, mb, mc),
    baselineGram: transposeTimes(wPhi, baseline.values, rows, mb, mb),
    currentGram: transposeTimes(wPsi, current.values, rows, mc, mc),
  };
}

/** MAC(i, j) for every baseline mode i and current mode j, row-major mb × mc (row = baseline mode). */
export function macFromProducts(p: ShapeProducts): Float64Array {
  const mb = p.baselineModes, mc = p.currentModes;
  const mac = new Float64Array(mb * mc);
  // MAC(i, j) = (ΦᵀWΨ)ᵢⱼ² / ((ΦᵀWΦ)ᵢᵢ (ΨᵀWΨ)ⱼⱼ)
  for (let i = 0; i < mb; i++) {
    const bi = p.baselineGram[i * mb + i];
    for (let j = 0; j < mc; j++) {
      const c = p.cross[j * mb + i];
      const d = bi * p.currentGram[j * mc + j];
      mac[i * mc + j] = d > 0 ? Math.min(1, (c * c) / d) : 0;
    }
  }
  return mac;
}

/** The MAC matrix of two shape sets (row-major, row = baseline mode). */
export function macMatrix(baseline: ShapeBlock, current: ShapeBlock, weight?: SymmetricCsc): Float64Array {
  return macFromProducts(shapeProducts(baseline, current, weight));
}

/** MAC of two single shapes of equal length. */
export function modalAssuranceCriterion(phi: Float64Array, psi: Float64Array, weight?: SymmetricCsc): number {
  const n = phi.length;
  return macMatrix({ rows: n, cols: 1, values: phi }, { rows: n, cols: 1, values: psi }, weight)[0];
}

/**
 * P(φ_i, C): share of baseline mode i lying in the span of the current modes `group`
 * (`side` 'baseline'), or of current mode i in the span of the baseline modes `group`
 * (`side` 'current'). Falls back to the largest single MAC when the group's Gram is singular.
 */
export function subspaceShare(p: ShapeProducts, side: 'baseline' | 'current', i: number, group: readonly number[]): number {
  const k = group.length;
  const mb = p.baselineModes, mc = p.currentModes;
  const self = side === 'baseline' ? p.baselineGram[i * mb + i] : p.currentGram[i * mc + i];
  const g = new Float64Array(k);
  const gram = new Float64Array(k * k);
  const otherGram = side === 'baseline' ? p.currentGram : p.baselineGram;
  const m = side === 'baseline' ? mc : mb;
  // g_a = ⟨v_i, u_a⟩ and G_ab = ⟨u_a, u_b⟩ over the group members u
  for (let a = 0; a < k; a++) {
    g[a] = side === 'baseline' ? p.cross[group[a] * mb + i] : p.cross[i * mb + group[a]];
    for (let b = 0; b < k; b++) gram[b * k + a] = otherGram[group[b] * m + group[a]];
  }
  if (!(self > 0)) return 0;
  const l = cholesky(gram, k);
  if (!l.ok) return Math.max(...Array.from(g, (x, a) => (x * x) / (self * gram[a * k + a] || Infinity)));
  solveLower(l.lower, k, g, 1);
  let share = 0;
  // g G⁻¹ gᵀ = ‖L⁻¹ gᵀ‖²
  for (let a = 0; a < k; a++) share += g[a] * g[a];
  return Math.min(1, share / self);
}

/**
 * cos θ of the principal angles between the baseline modes `baseline` and the current modes
 * `current` (0-based), descending, min(k_B, k_C) of them; empty when a Gram is singular.
 */
export function principalAngleCosines(p: ShapeProducts, baseline: readonly number[], current: readonly number[]): number[] {
  const kb = baseline.length, kc = current.length;
  const mb = p.baselineModes, mc = p.currentModes;
  const gb = new Float64Array(kb * kb), gc = new Float64Array(kc * kc), x = new Float64Array(kb * kc);
  // the two Grams and X = Φ_BᵀWΨ_C, column-major
  for (let a = 0; a < kb; a++) for (let b = 0; b < kb; b++) gb[b * kb + a] = p.baselineGram[baseline[b] * mb + baseline[a]];
  for (let a = 0; a < kc; a++) for (let b = 0; b < kc; b++) gc[b * kc + a] = p.currentGram[current[b] * mc + current[a]];
  for (let a = 0; a < kb; a++) for (let b = 0; b < kc; b++) x[b * kb + a] = p.cross[current[b] * mb + baseline[a]];
  const lb = cholesky(gb, kb), lc = cholesky(gc, kc);
  if (!lb.ok || !lc.ok) return [];
  solveLower(lb.lower, kb, x, kc);
  const t = new Float64Array(kc * kb);
  // T = (L_B⁻¹ X)ᵀ, then T ← L_C⁻¹ T = Cᵀ with C = L_B⁻¹ X L_C⁻ᵀ
  for (let a = 0; a < kb; a++) for (let b = 0; b < kc; b++) t[a * kc + b] = x[b * kb + a];
  solveLower(lc.lower, kc, t, kb);
  const ctc = new Float64Array(kc * kc);
  // CᵀC = T Tᵀ (kc × kc): its eigenvalues are the squared singular values of C
  for (let a = 0; a < kc; a++) {
    for (let b = 0; b < kc; b++) {
      let s = 0;
      for (let r = 0; r < kb; r++) s += t[r * kc + a] * t[r * kc + b];
      ctc[b * kc + a] = s;
    }
  }
  const squares = Array.from(symmetricEigenvalues(ctc, kc)).sort((u, v) => v - u).slice(0, Math.min(kb, kc));
  return squares.map((q) => Math.min(1, Math.sqrt(Math.max(0, q))));
}

/** Rows `dofs` of a column-major n × cols block. */
export function restrictRows(values: Float64Array, n: number, cols: number, dofs: Int32Array): Float64Array {
  const out = new Float64Array(dofs.length * cols);
  // out(s, j) = values(dofs[s], j)
  for (let j = 0; j < cols; j++) {
    for (let s = 0; s < dofs.length; s++) out[j * dofs.length + s] = values[j * n + dofs[s]];
  }
  return out;
}
