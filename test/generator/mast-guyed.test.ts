/**
 * Demo mast with guys: fastened anchors vs one anchor left unfastened (a local mechanism).
 */
import { describe, expect, it } from 'vitest';
import { buildMast } from '../../fixtures/generator/mast.js';
import { symMultiply, maxAbsEntry } from '../../src/sparse/csc.js';
import { dofOfNode } from '../../fixtures/generator/model-types.js';
import { generalizedEigenvalues } from './dense-reference.js';

describe('guyed mast', () => {
  const guyed = buildMast({ base: 'clamped', guyed: true });
  const loose = buildMast({ base: 'clamped', guyed: true, looseAnchors: [902] });

  it('the unfastened anchor adds exactly one near-zero eigenvalue (4-panel version, same builder)', () => {
    // Dense reference eigenvalues (ml-matrix). A node held by two rods in one plane can move
    // out of that plane without strain: one zero-energy mode (statics of pin-jointed frames, common practice).
    // Dense check on a smaller tower built by the same code, to keep the test fast.
    const small = { base: 'clamped', guyed: true, panels: 4, segmentsPerMember: 1 } as const;
    const g = buildMast(small);
    const l = buildMast({ ...small, looseAnchors: [902] });
    expect(l.stiffness.n).toBe(g.stiffness.n + 3);
    const evGuyed = generalizedEigenvalues(g.stiffness, g.mass);
    const evLoose = generalizedEigenvalues(l.stiffness, l.mass);
    // near zero: below 1e-8 of the first eigenvalue of the fastened tower
    const nearZero = 1e-8 * evGuyed[0];
    expect(evGuyed.filter((v) => Math.abs(v) < nearZero).length).toBe(0);
    expect(evLoose.filter((v) => Math.abs(v) < nearZero).length).toBe(1);
    expect(evLoose[1]).toBeGreaterThan(0.1 * evGuyed[0]); // the next mode is a real elastic one
  });

  it('in the 12 m demo mast the zero-energy motion is the anchor moving out of its guys’ plane', () => {
    // anchor 902 lies in line with leg 2 (angle 90° + 120°); out of plane = the tangential direction
    const angle = (210 * Math.PI) / 180;
    const t = new Float64Array(loose.stiffness.n);
    t[dofOfNode(loose, 902, 0)] = -Math.sin(angle);
    t[dofOfNode(loose, 902, 1)] = Math.cos(angle);
    const kt = symMultiply(loose.stiffness, t);
    const norm = Math.sqrt(kt.reduce((s, v) => s + v * v, 0));
    expect(norm).toBeLessThan(1e-12 * maxAbsEntry(loose.stiffness));
    expect(dofOfNode(guyed, 902, 0)).toBe(-1); // fastened: translations removed
  });
});
