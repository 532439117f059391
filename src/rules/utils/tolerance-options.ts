/**
 * The options of the rules that compare one measured number against a tolerance
 * (mass-normalization, mass-orthogonality, stiffness-orthogonality, eigen-residual,
 * matrix-symmetry): `{ tolerance }`, validated by this schema.
 */
export interface ToleranceOptions {
  tolerance: number;
}

/** Schema of `{ tolerance }`; `allowZero` for checks where an exact 0 limit makes sense. */
export function toleranceOptionsSchema(allowZero = false): Record<string, unknown> {
  const bound = allowZero ? { minimum: 0 } : { exclusiveMinimum: 0 };
  return {
    type: 'object',
    properties: { tolerance: { type: 'number', ...bound } },
    additionalProperties: false,
  };
}
