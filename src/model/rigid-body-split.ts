/**
 * Which of the solved modes are rigid-body modes (or mechanisms)?
 *
 * Two published forms of the criterion (ECSS-E-ST-32-03C as quoted in docs/sources.md §1a/§6, [S]):
 *  - absolute: f ≤ d with d = 0.005 Hz;
 *  - separation: f_rigid / f_first-elastic < V with V = 1e-4.
 * The absolute form depends on the unit system through round-off (f_round-off ~ √(ε‖K‖/‖M‖)/2π,
 * common practice), so the separation form is the default here: the split is put at the last
 * gap where every mode below is smaller than V times the mode above. When the solved modes show
 * no such gap (a supported model, or too few modes solved) the absolute cutoff is used instead.
 */

export type CutoffBasis = 'ratio' | 'hz';

export interface RigidBodyCutoffOptions {
  cutoffBasis: CutoffBasis;
  cutoffRatio: number;
  cutoffHz: number;
}

export const cutoffDefaults: RigidBodyCutoffOptions = {
  cutoffBasis: 'ratio',
  cutoffRatio: 1e-4, // ECSS-E-ST-32-03C separation V, [S] docs/sources.md §1a
  cutoffHz: 0.005, // ECSS-E-ST-32-03C absolute d, [S] docs/sources.md §1a
};

/** Schema properties shared by every rule that needs the split (merge into its optionsSchema). */
export const cutoffSchemaProperties = {
  cutoffBasis: {
    enum: ['ratio', 'hz'],
    description: "'ratio': a mode is rigid-body when it is below cutoffRatio × the first elastic frequency; 'hz': below cutoffHz.",
  },
  cutoffRatio: { type: 'number', exclusiveMinimum: 0, exclusiveMaximum: 1 },
  cutoffHz: { type: 'number', exclusiveMinimum: 0 },
} as const;

export interface RigidBodySplit {
  /** Modes 0..count−1 are rigid-body modes (or mechanisms). */
  count: number;
  /** 0-based index of the first elastic mode, null when every solved mode is below the cutoff. */
  firstElasticIndex: number | null;
  /** The cutoff in Hz that was applied. */
  cutoffHz: number;
  basis: CutoffBasis;
  /** True when the ratio form found no gap and the absolute cutoff was used. */
  fellBack: boolean;
  /** With the ratio form: the ratio and the first elastic frequency it was applied to (for messages). */
  ratio?: { cutoffRatio: number; firstElasticHz: number };
}

export function splitRigidBodyModes(frequenciesHz: ArrayLike<number>, o: RigidBodyCutoffOptions): RigidBodySplit {
  const m = frequenciesHz.length;
  if (o.cutoffBasis === 'ratio') {
    const k = lastSeparationGap(frequenciesHz, o.cutoffRatio);
    if (k > 0) {
      const cutoffHz = o.cutoffRatio * frequenciesHz[k];
      return {
        count: k,
        firstElasticIndex: k,
        cutoffHz,
        basis: 'ratio',
        fellBack: false,
        ratio: { cutoffRatio: o.cutoffRatio, firstElasticHz: frequenciesHz[k] },
      };
    }
  }
  // count modes with signed frequency below the absolute cutoff (tiny negative λ from round-off included)
  let count = 0;
  while (count < m && frequenciesHz[count] < o.cutoffHz) count++;
  return {
    count,
    firstElasticIndex: count < m ? count : null,
    cutoffHz: o.cutoffHz,
    basis: 'hz',
    fellBack: o.cutoffBasis === 'ratio',
  };
}

/** Largest k ≥ 1 with max_{i<k} |f_i| < ratio · f_k (f_k > 0), or 0 when there is none. */
function lastSeparationGap(f: ArrayLike<number>, ratio: number): number {
  const prefixMax = new Float64Array(f.length + 1);
  // prefixMax[k] = max_{i<k} |f_i|
  for (let i = 0; i < f.length; i++) prefixMax[i + 1] = Math.max(prefixMax[i], Math.abs(f[i]));
  // scan from the top: the highest gap wins, so every mode under it counts as rigid
  for (let k = f.length - 1; k >= 1; k--) {
    if (f[k] > 0 && prefixMax[k] < ratio * f[k]) return k;
  }
  return 0;
}
