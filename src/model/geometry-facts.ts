/**
 * Geometry-aware facts about a model (rigid-body vectors, mass properties, participation,
 * mechanism localization). Filled in by src/model/ geometry modules when a DOF map is given;
 * read by the geometry rules. Placeholder until those modules land.
 */
export interface GeometryFacts {
  [key: string]: unknown;
}
