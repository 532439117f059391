"""SciPy side of test/bench/modes-bench.ts: eigsh(K, k, M=M, sigma) on the same Matrix Market files.

Usage: python3 scipy_eigsh_bench.py K.mtx M.mtx k sigma out.json
Writes {"eigenvalues", "seconds", "peakRssKb", "ordering"}. The shift-invert solve uses SuperLU with
the symmetric MMD_AT_PLUS_A column ordering (SciPy's default COLAMD is far slower on 3-D solids,
see CRITERIA.md section 8), passed to eigsh as OPinv.
"""
import json
import resource
import sys
import time

import numpy as np
import scipy.io
import scipy.sparse.linalg as sla


def main() -> None:
    k_path, m_path, k, sigma, out = sys.argv[1], sys.argv[2], int(sys.argv[3]), float(sys.argv[4]), sys.argv[5]
    K = scipy.io.mmread(k_path).tocsc()
    M = scipy.io.mmread(m_path).tocsc()
    n = K.shape[0]
    t0 = time.perf_counter()
    lu = sla.splu((K - sigma * M).tocsc(), permc_spec="MMD_AT_PLUS_A")
    opinv = sla.LinearOperator((n, n), matvec=lu.solve, dtype=float)
    vals = sla.eigsh(K, k=k, M=M, sigma=sigma, which="LM", OPinv=opinv, tol=0,
                     v0=np.random.default_rng(0).standard_normal(n))[0]
    seconds = time.perf_counter() - t0
    peak = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    with open(out, "w") as f:
        json.dump({"eigenvalues": sorted(float(v) for v in vals), "seconds": seconds, "peakRssKb": peak,
                   "ordering": "SuperLU MMD_AT_PLUS_A"}, f)


if __name__ == "__main__":
    main()
