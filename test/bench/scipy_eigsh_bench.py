"""SciPy side of test/bench/modes-bench.ts: eigsh(K, k, M=M, sigma) on the same Matrix Market files.

Usage: python3 scipy_eigsh_bench.py K.mtx M.mtx k sigma out.json [nd|mmd]
Writes {"eigenvalues", "seconds", "peakRssKb", "ordering", "solves"}. The shift-invert solve is
SuperLU passed to eigsh as OPinv, on one of two orderings: "nd", METIS nested dissection (pymetis)
of K - sigma*M with SuperLU in symmetric mode on the permuted matrix, or "mmd", SuperLU's symmetric
MMD_AT_PLUS_A column ordering (SciPy's default COLAMD is far slower on 3-D solids). Without the
last argument: "nd" when pymetis is installed, else "mmd". modes-bench.ts runs both and keeps the
faster. The ordering time is part of "seconds", as it is of ours; "solves" counts the applications
of the shift-invert operator (one sparse triangular solve pair each) that ARPACK asked for.
"""
import json
import resource
import sys
import time

import numpy as np
import scipy.io
import scipy.sparse.linalg as sla


def default_ordering():
    """The ordering used when none is named: nd when pymetis is installed, else mmd."""
    try:
        import pymetis  # noqa: F401
    except ImportError:
        return "mmd"
    return "nd"


def shift_invert(a, ordering):
    """(a^-1 as a LinearOperator, name of the ordering used, a list whose length counts the solves)."""
    n = a.shape[0]
    solves = []
    if ordering == "mmd":
        lu = sla.splu(a.tocsc(), permc_spec="MMD_AT_PLUS_A")

        def solve_mmd(b):
            solves.append(1)
            return lu.solve(b)

        return sla.LinearOperator((n, n), matvec=solve_mmd, dtype=float), "SuperLU MMD_AT_PLUS_A", solves
    import pymetis
    g = a.tocsr(copy=True)
    g.setdiag(0)
    g.eliminate_zeros()
    perm = np.asarray(pymetis.nested_dissection(xadj=g.indptr, adjncy=g.indices)[0])
    lu = sla.splu(a.tocsr()[perm][:, perm].tocsc(), permc_spec="NATURAL", diag_pivot_thresh=0.0,
                  options={"SymmetricMode": True})

    def solve(b):
        solves.append(1)
        x = np.empty_like(b, dtype=float)
        x[perm] = lu.solve(np.asarray(b, dtype=float).ravel()[perm])
        return x

    return sla.LinearOperator((n, n), matvec=solve, dtype=float), "SuperLU on METIS nested dissection", solves


def main() -> None:
    k_path, m_path, k, sigma, out = sys.argv[1], sys.argv[2], int(sys.argv[3]), float(sys.argv[4]), sys.argv[5]
    ordering = sys.argv[6] if len(sys.argv) > 6 else default_ordering()
    if ordering not in ("nd", "mmd"):
        sys.exit(f"ordering must be nd or mmd, got {ordering!r}")
    K = scipy.io.mmread(k_path).tocsc()
    M = scipy.io.mmread(m_path).tocsc()
    n = K.shape[0]
    t0 = time.perf_counter()
    opinv, ordering_name, solves = shift_invert(K - sigma * M, ordering)
    vals = sla.eigsh(K, k=k, M=M, sigma=sigma, which="LM", OPinv=opinv, tol=0,
                     v0=np.random.default_rng(0).standard_normal(n))[0]
    seconds = time.perf_counter() - t0
    peak = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    with open(out, "w") as f:
        json.dump({"eigenvalues": sorted(float(v) for v in vals), "seconds": seconds, "peakRssKb": peak,
                   "ordering": ordering_name, "solves": len(solves)}, f)


if __name__ == "__main__":
    main()
