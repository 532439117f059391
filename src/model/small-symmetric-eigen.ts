/**
 * Eigenvalues and eigenvectors of a small dense symmetric matrix (k ≲ 50) by the cyclic
 * Jacobi method: repeated plane rotations J_pqᵀ A J_pq, each zeroing a_pq, until the
 * off-diagonal mass is below ε·‖A‖_F. Used for 3 × 3 inertia tensors and for the k × k
 * Gram matrices of near-zero mode spaces; never for n × n model matrices.
 */
export interface SmallEigen {
  /** Ascending. */
  values: Float64Array;
  /** Column-major k × k, column j belongs to values[j]. */
  vectors: Float64Array;
}

/** `a` is row/column-major k × k symmetric (only symmetry is used); it is not modified. */
export function smallSymmetricEigen(a: ArrayLike<number>, k: number): SmallEigen {
  const m = Float64Array.from(a as ArrayLike<number>);
  const v = new Float64Array(k * k);
  for (let i = 0; i < k; i++) v[i * k + i] = 1; // V = I
  let frob = 0;
  for (let i = 0; i < k * k; i++) frob += m[i] * m[i];
  const tol = 1e-30 * frob + Number.MIN_VALUE;
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0;
    // off-diagonal mass Σ_{p<q} a_pq²
    for (let p = 0; p < k; p++) for (let q = p + 1; q < k; q++) off += m[q * k + p] * m[q * k + p];
    if (off <= tol) break;
    // one sweep: a rotation in every (p, q) plane
    for (let p = 0; p < k; p++) {
      for (let q = p + 1; q < k; q++) rotate(m, v, k, p, q);
    }
  }
  const order = Array.from({ length: k }, (_, i) => i).sort((i, j) => m[i * k + i] - m[j * k + j]);
  const values = new Float64Array(k);
  const vectors = new Float64Array(k * k);
  // sort eigenpairs ascending
  order.forEach((src, dst) => {
    values[dst] = m[src * k + src];
    for (let i = 0; i < k; i++) vectors[dst * k + i] = v[src * k + i];
  });
  return { values, vectors };
}

/** Zero m[p][q] by the rotation with tan 2θ = 2 a_pq / (a_qq − a_pp); accumulate it into V. */
function rotate(m: Float64Array, v: Float64Array, k: number, p: number, q: number): void {
  const apq = m[q * k + p];
  if (apq === 0) return;
  const app = m[p * k + p];
  const aqq = m[q * k + q];
  const theta = (aqq - app) / (2 * apq);
  const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
  const c = 1 / Math.sqrt(t * t + 1);
  const s = t * c;
  // A ← Jᵀ A J on rows/columns p and q
  for (let r = 0; r < k; r++) {
    const arp = m[p * k + r];
    const arq = m[q * k + r];
    m[p * k + r] = c * arp - s * arq;
    m[q * k + r] = s * arp + c * arq;
  }
  for (let r = 0; r < k; r++) {
    const apr = m[r * k + p];
    const aqr = m[r * k + q];
    m[r * k + p] = c * apr - s * aqr;
    m[r * k + q] = s * apr + c * aqr;
  }
  // V ← V J
  for (let r = 0; r < k; r++) {
    const vrp = v[p * k + r];
    const vrq = v[q * k + r];
    v[p * k + r] = c * vrp - s * vrq;
    v[q * k + r] = s * vrp + c * vrq;
  }
}
