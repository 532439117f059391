"""Writes the bad-input corpus next to this script: defective Matrix Market files and DOF maps,
plus manifest.json naming for each file the line the error must point at and words the message
must contain. Run once (python3 make_bad_inputs.py); the outputs are committed."""
import gzip, json, os

here = os.path.dirname(os.path.abspath(__file__))
manifest = []
B = '%%MatrixMarket matrix coordinate real symmetric\n'
G = '%%MatrixMarket matrix coordinate real general\n'
GOOD3 = B + '3 3 4\n1 1 4.0\n2 1 -1.0\n2 2 4.0\n3 3 4.0\n'


def mtx(name, text, line, says, kind='matrix'):
    data = text if isinstance(text, bytes) else text.encode('latin1')
    with open(os.path.join(here, name), 'wb') as f:
        f.write(data)
    manifest.append({'file': name, 'kind': kind, 'line': line, 'says': says})


mtx('empty.mtx', '', 1, 'empty')
mtx('no-banner.mtx', '3 3 1\n1 1 1.0\n', 1, 'banner')
mtx('banner-typo.mtx', '%%MatrixMarkt matrix coordinate real symmetric\n3 3 1\n1 1 1\n', 1, 'banner')
mtx('single-percent-banner.mtx', '%MatrixMarket matrix coordinate real symmetric\n3 3 1\n1 1 1\n', 1, 'exactly')
mtx('banner-missing-word.mtx', '%%MatrixMarket matrix coordinate real\n3 3 1\n1 1 1\n', 1, 'four words')
mtx('banner-extra-word.mtx', '%%MatrixMarket matrix coordinate real symmetric extra\n3 3 1\n1 1 1\n', 1, 'four words')
mtx('vector-object.mtx', '%%MatrixMarket vector coordinate real general\n3 1\n1 1\n', 1, "only 'matrix'")
mtx('unknown-format.mtx', '%%MatrixMarket matrix sparse real symmetric\n3 3 1\n1 1 1\n', 1, 'unknown format')
mtx('unknown-field.mtx', '%%MatrixMarket matrix coordinate double symmetric\n3 3 1\n1 1 1\n', 1, 'unknown field')
mtx('unknown-symmetry.mtx', '%%MatrixMarket matrix coordinate real lower\n3 3 1\n1 1 1\n', 1, 'unknown symmetry')
mtx('complex-field.mtx', '%%MatrixMarket matrix coordinate complex symmetric\n3 3 1\n1 1 1.0 0.0\n', 1, 'complex')
mtx('pattern-field.mtx', '%%MatrixMarket matrix coordinate pattern symmetric\n3 3 1\n1 1\n', 1, 'pattern')
mtx('hermitian.mtx', '%%MatrixMarket matrix coordinate real hermitian\n3 3 1\n1 1 1\n', 1, 'hermitian')
mtx('skew-symmetric.mtx', '%%MatrixMarket matrix coordinate real skew-symmetric\n3 3 1\n2 1 1\n', 1, 'skew-symmetric')
mtx('binary-garbage.mtx', bytes(range(256)) * 4, 1, 'banner')
mtx('no-size-line.mtx', B + '% only comments\n%\n\n', 4, 'before the size line')
mtx('size-line-non-numeric.mtx', B + '% c\n3 three 4\n1 1 1\n', 3, 'size line')
mtx('size-line-two-numbers.mtx', B + '3 3\n1 1 1\n', 2, 'size line')
mtx('size-line-negative.mtx', B + '3 3 -2\n1 1 1\n', 2, 'size line')
mtx('non-square.mtx', G + '3 4 1\n1 1 1.0\n', 2, 'square')
mtx('zero-size.mtx', B + '0 0 0\n', 2, 'no rows')
mtx('declared-too-large.mtx', B + '1000 1000 100000000\n1 1 1.0\n', 2, 'can hold at most')
mtx('order-too-large.mtx', B + '2000000000 2000000000 1\n1 1 1.0\n', 2, 'beyond')
mtx('zero-index.mtx', B + '3 3 2\n1 1 1.0\n0 1 2.0\n', 4, 'index 0')
mtx('negative-index.mtx', B + '3 3 2\n1 1 1.0\n2 -1 2.0\n', 4, 'negative')
mtx('index-out-of-range.mtx', B + '3 3 2\n1 1 1.0\n4 1 2.0\n', 4, 'outside 1..3')
mtx('fractional-index.mtx', B + '3 3 2\n1 1 1.0\n2.0 1 2.0\n', 4, 'whole number')
mtx('text-index.mtx', B + '3 3 2\n1 1 1.0\nx 1 2.0\n', 4, "row index is 'x'")
mtx('only-row-index.mtx', B + '3 3 2\n1 1 1.0\n2\n', 4, 'only a row index')
mtx('missing-value.mtx', B + '3 3 2\n1 1 1.0\n2 1\n', 4, 'no value')
mtx('non-numeric-value.mtx', B + '3 3 2\n1 1 1.0\n2 1 abc\n', 4, 'not a number')
mtx('nan-value.mtx', B + '3 3 2\n1 1 1.0\n2 1 NaN\n', 4, 'not a finite number')
mtx('inf-value.mtx', B + '3 3 2\n1 1 inf\n2 1 1.0\n', 3, 'not a finite number')
mtx('overflow-value.mtx', B + '3 3 2\n1 1 1.0\n2 2 1e400\n', 4, 'not finite')
mtx('bad-exponent.mtx', B + '3 3 2\n1 1 1.0e\n2 2 1.0\n', 3, 'not a number')
mtx('comma-decimal.mtx', B + '3 3 2\n1 1 1,5\n2 2 1.0\n', 3, 'not a number')
mtx('trailing-garbage.mtx', B + '3 3 2\n1 1 1.0 xyz\n2 2 1.0\n', 3, 'unexpected text')
mtx('too-few-entries.mtx', B + '3 3 3\n1 1 1.0\n2 2 1.0\n', 4, 'ends after 2 of the 3')
mtx('too-many-entries.mtx', B + '3 3 2\n1 1 1.0\n2 2 1.0\n3 3 1.0\n', 5, 'more entries')
mtx('upper-triangle-in-symmetric.mtx', B + '3 3 3\n1 1 1.0\n1 2 5.0\n2 2 1.0\n', 4, 'above the diagonal')
mtx('asymmetric-general.mtx', G + '3 3 5\n1 1 4.0\n2 1 -1.0\n1 2 -1.5\n2 2 4.0\n3 3 4.0\n', 4, 'not symmetric')
mtx('one-sided-general.mtx', G + '3 3 4\n1 1 4.0\n3 1 -1.0\n2 2 4.0\n3 3 4.0\n', 4, 'not symmetric')
mtx('integer-field-real-value.mtx', '%%MatrixMarket matrix coordinate integer symmetric\n3 3 2\n1 1 2\n2 2 2.5\n', 4, 'whole number')
mtx('comment-after-size.mtx', B + '3 3 2\n1 1 1.0\n% late comment\n2 2 1.0\n', 4, 'comments must come before')
mtx('array-too-few-values.mtx', '%%MatrixMarket matrix array real general\n2 2\n1\n0\n0\n', 5, 'ends after 3 of the 4')
mtx('array-two-values-per-line.mtx', '%%MatrixMarket matrix array real general\n2 2\n1 0\n0 1\n', 3, 'unexpected text')
full = GOOD3.encode()
mtx('truncated.mtx.gz', gzip.compress(full)[:-12], 6, 'truncated')
mtx('gzip-bad-entry.mtx.gz', gzip.compress((B + '3 3 2\n1 1 1.0\n7 1 2.0\n').encode()), 4, 'outside 1..3')
mtx('gzip-declared-too-large.mtx.gz', gzip.compress((B + '1000 1000 100000000\n1 1 1.0\n').encode()), 2, 'even decompressed')
mtx('gzip-corrupt.mtx.gz', b'\x1f\x8b' + bytes(range(3, 200)), 1, 'not valid gzip data')
mtx('gzip-no-size-line.mtx.gz', gzip.compress((B + '% nothing else\n').encode()), 2, 'before the size line')

# good small matrices used with the DOF-map cases and the K/M size check
os.makedirs(os.path.join(here, '..', 'good-inputs'), exist_ok=True)
with open(os.path.join(here, '..', 'good-inputs', 'k3.mtx'), 'w') as f:
    f.write(GOOD3)
with open(os.path.join(here, '..', 'good-inputs', 'm2.mtx'), 'w') as f:
    f.write(B + '2 2 2\n1 1 1.0\n2 2 1.0\n')
with open(os.path.join(here, '..', 'good-inputs', 'dofs3.csv'), 'w') as f:
    f.write('dof,node,component,x,y,z\n1,10,ux,0,0,0\n2,10,uy,0,0,0\n3,11,rz,1.5,0,-2e-3\n')

H = 'dof,node,component,x,y,z\n'


def dofs(name, text, line, says):
    mtx(name, text, line, says, kind='dofmap')


dofs('dofmap-empty.csv', '', 1, 'empty')
dofs('dofmap-bad-header.csv', 'dof,node,comp,x,y,z\n1,10,ux,0,0,0\n', 1, 'header')
dofs('dofmap-wrong-field-count.csv', H + '1,10,ux,0,0\n', 2, '6 comma-separated')
dofs('dofmap-dof-not-integer.csv', H + '1.5,10,ux,0,0,0\n', 2, 'not a whole number')
dofs('dofmap-dof-zero.csv', H + '0,10,ux,0,0,0\n', 2, 'outside 1..3')
dofs('dofmap-dof-out-of-range.csv', H + '1,10,ux,0,0,0\n2,10,uy,0,0,0\n4,11,rz,1,0,0\n', 4, 'outside 1..3')
dofs('dofmap-duplicate-dof.csv', H + '1,10,ux,0,0,0\n2,10,uy,0,0,0\n2,11,rz,1,0,0\n', 4, 'listed twice (first on line 3)')
dofs('dofmap-missing-dof.csv', H + '1,10,ux,0,0,0\n3,11,rz,1,0,0\n', 3, 'dof 2 is missing')
dofs('dofmap-unknown-component.csv', H + '1,10,ux,0,0,0\n2,10,uw,0,0,0\n3,11,rz,1,0,0\n', 3, "unknown component 'uw'")
dofs('dofmap-node-zero.csv', H + '1,0,ux,0,0,0\n', 2, 'positive whole number')
dofs('dofmap-node-negative.csv', H + '1,-4,ux,0,0,0\n', 2, 'positive whole number')
dofs('dofmap-coordinate-nan.csv', H + '1,10,ux,NaN,0,0\n', 2, "coordinate x 'NaN'")
dofs('dofmap-coordinate-text.csv', H + '1,10,ux,0,,0\n', 2, "coordinate y ''")
dofs('dofmap-coordinate-infinite.csv', H + '1,10,ux,0,0,1e999\n', 2, "coordinate z '1e999'")
dofs('dofmap-inconsistent-node.csv', H + '1,10,ux,0,0,0\n2,10,uy,0,1,0\n3,11,rz,1,0,0\n', 3, 'node 10 has coordinates')
dofs('dofmap-node-component-twice.csv', H + '1,10,ux,0,0,0\n2,10,ux,0,0,0\n3,11,rz,1,0,0\n', 3, 'already dof 1')

with open(os.path.join(here, 'manifest.json'), 'w') as f:
    json.dump(manifest, f, indent=1)
print(len([m for m in manifest if m['kind'] == 'matrix']), 'matrix files,', len([m for m in manifest if m['kind'] == 'dofmap']), 'DOF maps')
