import { describe, expect, it } from 'vitest';
import { cutoffDefaults, cutoffPhrase, splitRigidBodyModes } from '../../../src/rules/utils/rigid-body-split.js';

describe('rigid-body split', () => {
  it('falls back to the absolute cutoff when no separation gap exists (supported model)', () => {
    const s = splitRigidBodyModes(Float64Array.from([3.2, 7.7, 12]), cutoffDefaults);
    expect(s).toMatchObject({ count: 0, firstElasticIndex: 0, basis: 'hz', fellBack: true });
    expect(cutoffPhrase(s)).toBe('below 0.005 Hz');
  });
  it('puts the split at the highest gap', () => {
    const s = splitRigidBodyModes(Float64Array.from([0, 1e-9, 2e-6, 10, 11]), cutoffDefaults);
    expect(s.count).toBe(3);
    expect(s.cutoffHz).toBeCloseTo(1e-3, 12);
    expect(cutoffPhrase(s)).toBe('below 0.0001 × the first elastic frequency (10 Hz)');
  });
});
