/**
 * Facts from comparing a model's modes with a stored baseline (MAC, pairing, drift).
 * Filled in by src/model/ baseline modules; read by the regression rules.
 * Placeholder until those modules land.
 */
export interface ComparisonFacts {
  [key: string]: unknown;
}
