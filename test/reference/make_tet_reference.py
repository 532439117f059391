"""Reference eigenvalues of the tetrahedral models (test/reference/tet-reference-models.ts).

Offline, with numpy/scipy (general-purpose libraries, outside the project):
    npm run build && node dist/test/reference/write-tet-reference-models.js /tmp/tet-reference
    python3 test/reference/make_tet_reference.py /tmp/tet-reference

For each model: the lowest eigenvalues of K x = lambda M x by scipy.sparse.linalg.eigsh in
shift-invert mode (sigma slightly below zero, so singular K is fine) -- these are the reference,
with their largest residual -- and, for n <= 6000, again by dense scipy.linalg.eigh (LAPACK
generalized symmetric-definite solver) as a cross-check, with the largest relative difference on
the elastic eigenvalues. The dense solver's error is relative to the largest eigenvalue of the
whole model, so on the lowest ones it agrees only to about 1e-11 .. 1e-5 (the latter where the
model has zero modes); shift-invert is accurate relative to the eigenvalues near the shift. Also the size, the number of stored
entries and the traces of K and M, so the test can tell it rebuilt the same matrices.
Writes test/reference/tet-reference-eigenvalues.json.
"""
import json
import os
import sys

import numpy as np
import scipy
import scipy.io
import scipy.linalg
import scipy.sparse.linalg

MODELS = [("tet4-bracket-clamped", 20), ("tet10-bracket-clamped", 20), ("tet10-jointed-bracket", 24)]
# Shift (2 pi 100 Hz)^2 below zero: K may be singular (the jointed bracket). A shift much closer to
# zero (we first tried 1 Hz) leaves K - sigma M so ill-conditioned beside the zero modes that
# eigsh's elastic eigenvalues came out wrong by up to 6e-6 (relative; dense eigh and our solver
# agreed with each other to 1e-11 there); at 100 Hz the three agree.
SIGMA = -(2 * np.pi * 100.0) ** 2


def read(path):
    a = scipy.io.mmread(path).tocsc()
    stored = scipy.sparse.tril(a).nnz
    return a, stored


def main(directory):
    out = {
        "about": "Lowest eigenvalues lambda = omega^2 ((rad/s)^2) of K x = lambda M x for the tetrahedral "
        "models of test/reference/tet-reference-models.ts, made by test/reference/make_tet_reference.py "
        "with scipy %s / numpy %s (eigsh shift-invert; dense eigh check)." % (scipy.__version__, np.__version__),
        "models": {},
    }
    for name, count in MODELS:
        K, storedK = read(os.path.join(directory, name + ".stiffness.mtx"))
        M, storedM = read(os.path.join(directory, name + ".mass.mtx"))
        n = K.shape[0]
        vals, vecs = scipy.sparse.linalg.eigsh(K, k=count, M=M, sigma=SIGMA, which="LM", tol=0)
        order = np.argsort(vals)
        vals, vecs = vals[order], vecs[:, order]
        # residual ||K x - lambda M x|| / (||K x|| + |lambda| ||M x||) of each elastic eigsh pair
        # (for a zero mode K x is itself rounding, so the ratio says nothing there)
        KX, MX = K @ vecs, M @ vecs
        residual = np.linalg.norm(KX - MX * vals, axis=0) / (np.linalg.norm(KX, axis=0) + np.abs(vals) * np.linalg.norm(MX, axis=0))
        residual = residual[np.abs(vals) > 1e-6 * vals[-1]]
        entry = {
            "n": n,
            "storedEntriesK": int(storedK),
            "storedEntriesM": int(storedM),
            "traceK": float(K.diagonal().sum()),
            "traceM": float(M.diagonal().sum()),
            "eigenvalues": [float(v) for v in vals],
            "maxResidualElastic": float(residual.max()),
        }
        if n <= 6000:
            dense = scipy.linalg.eigh(K.toarray(), M.toarray(), eigvals_only=True, subset_by_index=[0, count - 1])
            scale = vals[-1]
            elastic = np.abs(vals) > 1e-6 * scale
            entry["denseEigenvalues"] = [float(v) for v in dense]
            entry["maxRelativeDifferenceElastic"] = float(np.max(np.abs(dense[elastic] - vals[elastic]) / vals[elastic]))
        out["models"][name] = entry
        print(name, n, entry.get("maxRelativeDifferenceElastic"), vals[:6])
    target = os.path.join(os.path.dirname(os.path.abspath(__file__)), "tet-reference-eigenvalues.json")
    with open(target, "w") as f:
        json.dump(out, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main(sys.argv[1] if len(sys.argv) > 1 else "/tmp/tet-reference")
