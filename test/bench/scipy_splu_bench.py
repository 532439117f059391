#!/usr/bin/env python3
"""Reference timing for the sparse bench: factor a symmetric Matrix Market matrix with
scipy.sparse.linalg.splu (SuperLU) and print one JSON line.

usage: scipy_splu_bench.py MATRIX.mtx [PERMC_SPEC]

Prints {"permc_spec", "n", "nnz", "read_s", "factor_s", "factor_cpu_s", "nnz_L", "nnz_U",
"baseline_rss_mb", "peak_rss_mb", "peak_minus_baseline_mb"}. Peak RSS is the process high-water
mark (resource.getrusage ru_maxrss, KiB on Linux); the baseline is the RSS after the matrix is
read and converted to CSC, so the difference is the factorization's own memory.
Default PERMC_SPEC is SuperLU's default in SciPy ('COLAMD'). PERMC_SPEC 'METIS_ND' (needs the
pymetis package) orders the symmetric matrix by METIS nested dissection first and factors the
permuted matrix with SuperLU's natural column order, no row pivoting and symmetric mode, so
SuperLU works on the fill METIS predicts; the ordering time is reported apart as order_s.
"""
import json
import resource
import sys
import time

import numpy as np
import scipy.io
import scipy.sparse.linalg


def current_rss_mb():
    with open('/proc/self/statm') as f:
        pages = int(f.read().split()[1])
    return pages * resource.getpagesize() / 2**20


def metis_permuted(a):
    """P A Pᵀ with P from METIS nested dissection of A's graph (pymetis)."""
    import pymetis
    g = a.tocsr(copy=True)
    g.setdiag(0)
    g.eliminate_zeros()
    perm, _ = pymetis.nested_dissection(xadj=g.indptr, adjncy=g.indices)
    perm = np.asarray(perm)
    return a.tocsr()[perm][:, perm].tocsc()


def main():
    path = sys.argv[1]
    permc = sys.argv[2] if len(sys.argv) > 2 else 'COLAMD'
    t0 = time.perf_counter()
    a = scipy.io.mmread(path).tocsc()
    read_s = time.perf_counter() - t0
    order_s = 0.0
    options = {}
    if permc == 'METIS_ND':
        t = time.perf_counter()
        a = metis_permuted(a)
        order_s = time.perf_counter() - t
        options = {'permc_spec': 'NATURAL', 'diag_pivot_thresh': 0.0, 'options': {'SymmetricMode': True}}
    else:
        options = {'permc_spec': permc}
    base = current_rss_mb()
    t1 = time.perf_counter()
    c1 = time.process_time()
    lu = scipy.sparse.linalg.splu(a, **options)
    factor_s = time.perf_counter() - t1
    factor_cpu_s = time.process_time() - c1
    peak = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024
    print(json.dumps({
        'permc_spec': permc, 'n': a.shape[0], 'nnz': int(a.nnz), 'read_s': read_s, 'order_s': order_s,
        'factor_s': factor_s, 'factor_cpu_s': factor_cpu_s, 'nnz_L': int(lu.L.nnz), 'nnz_U': int(lu.U.nnz),
        'baseline_rss_mb': base, 'peak_rss_mb': peak, 'peak_minus_baseline_mb': peak - base,
    }))


if __name__ == '__main__':
    main()
