"""Offline reference fill counts for the ordering tests (run: python3 make_ordering_reference.py).

Builds the same grid patterns as grid-patterns.ts (node (x,y,z) -> x + nx*(y + ny*z), DOFs of a
node consecutive; 'box' couples the 26 surrounding nodes, 'faces' the 6 face neighbours), fills
them with a diagonally dominant SPD matrix, and records nnz(L) (unit diagonal included) of:
  natural  - SuperLU (scipy.sparse.linalg.splu) in natural order, no pivoting
  mmd      - SuperLU with its multiple minimum degree ordering on A+A' (permc_spec='MMD_AT_PLUS_A')
  rcm      - scipy.sparse.csgraph.reverse_cuthill_mckee, then SuperLU in that order
SymmetricMode with diag_pivot_thresh=0 keeps the pivots on the diagonal, so L is the
Cholesky/LDL' pattern of P A P'. Writes ordering-reference.json next to this script.
"""
import json
import os

import numpy as np
import scipy
import scipy.sparse as sp
from scipy.sparse.csgraph import reverse_cuthill_mckee
from scipy.sparse.linalg import splu


def grid_matrix(nx, ny, nz, dofs, coupling):
    nid = lambda x, y, z: x + nx * (y + ny * z)
    rows, cols = [], []
    for z in range(nz):
        for y in range(ny):
            for x in range(nx):
                a = nid(x, y, z)
                for dz in (-1, 0, 1):
                    for dy in (-1, 0, 1):
                        for dx in (-1, 0, 1):
                            X, Y, Z = x + dx, y + dy, z + dz
                            if not (0 <= X < nx and 0 <= Y < ny and 0 <= Z < nz):
                                continue
                            if coupling == 'faces' and abs(dx) + abs(dy) + abs(dz) > 1:
                                continue
                            b = nid(X, Y, Z)
                            for d in range(dofs):
                                for e in range(dofs):
                                    rows.append(a * dofs + d)
                                    cols.append(b * dofs + e)
    n = nx * ny * nz * dofs
    a = sp.csc_matrix((-np.ones(len(rows)), (rows, cols)), shape=(n, n))
    a.sum_duplicates()
    a.data[:] = -1.0
    degree = np.asarray((a != 0).sum(axis=1)).ravel()
    return (a + sp.diags(degree + 1.0)).tocsc()


def nnz_l(a, permc_spec):
    lu = splu(a, permc_spec=permc_spec, diag_pivot_thresh=0.0, options={'SymmetricMode': True})
    return int(lu.L.nnz)


CASES = [
    ('grid2d-30x30-faces', (30, 30, 1, 1, 'faces')),
    ('grid3d-10x10x10-faces', (10, 10, 10, 1, 'faces')),
    ('box-8x8x8-3dof', (8, 8, 8, 3, 'box')),
    ('plate-24x24-6dof', (24, 24, 1, 6, 'box')),
]

out = {'generatedBy': 'make_ordering_reference.py', 'scipy': scipy.__version__, 'cases': {}}
for name, (nx, ny, nz, dofs, coupling) in CASES:
    a = grid_matrix(nx, ny, nz, dofs, coupling)
    perm = reverse_cuthill_mckee(sp.csr_matrix(a), symmetric_mode=True)
    ap = a[perm][:, perm].tocsc()
    out['cases'][name] = {
        'grid': [nx, ny, nz], 'dofsPerNode': dofs, 'coupling': coupling, 'n': a.shape[0],
        'natural': nnz_l(a, 'NATURAL'), 'mmd': nnz_l(a, 'MMD_AT_PLUS_A'), 'rcm': nnz_l(ap, 'NATURAL'),
    }
    print(name, out['cases'][name])

with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), 'ordering-reference.json'), 'w') as f:
    json.dump(out, f, indent=2)
    f.write('\n')
