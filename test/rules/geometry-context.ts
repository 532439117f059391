/**
 * Contexts with geometry facts for the geometry rules: generated models (fixtures/generator) with
 * their facts from src/model/compute-geometry.ts and modes from a dense reference eigensolver
 * (ml-matrix, test/model/helpers.ts).
 */
import { buildHexBox } from '../../fixtures/generator/hex-solid.js';
import { buildCantilever } from '../../fixtures/generator/cantilever.js';
import { STEEL } from '../../fixtures/generator/sections.js';
import type { GeneratedModel } from '../../fixtures/generator/model-types.js';
import { computeGeometry, type GeometryInput } from '../../src/model/compute-geometry.js';
import type { RuleContext } from '../../src/rules/rule-types.js';
import type { ModesResult } from '../../src/eigen/modes-types.js';
import { denseModes } from '../model/helpers.js';
import { cleanSummary } from './fake-model.js';

/**
 * A rule context with the model's geometry facts; `extra` adds geometry inputs (supported DOFs…),
 * `withMap: false` drops the DOF map (and so the geometry facts).
 */
export function geometryContext(
  model: Pick<GeneratedModel, 'stiffness' | 'mass' | 'dofMap'>,
  modes?: ModesResult,
  expectedRigidBodyModes?: number,
  extra: Partial<GeometryInput> = {},
  withMap = true,
): RuleContext {
  const n = model.stiffness.n;
  return {
    modelName: 'test',
    stiffness: model.stiffness,
    mass: model.mass,
    stiffnessSummary: cleanSummary('K.mtx', n),
    massSummary: cleanSummary('M.mtx', n),
    dofMap: withMap ? model.dofMap : undefined,
    modes,
    geometry: withMap ? computeGeometry({ stiffness: model.stiffness, mass: model.mass, dofMap: model.dofMap, modes, expectedRigidBodyModes, ...extra }) : undefined,
  };
}

/** A free-free steel block 0.3 × 0.2 × 0.5 m with its corner at the origin. */
export const blockSize = [0.3, 0.2, 0.5] as const;
/** m = ρ V of the homogeneous block. */
export const blockMassKg = STEEL.densityKgM3 * blockSize[0] * blockSize[1] * blockSize[2];
/** Centroid of a homogeneous cuboid = its centre. */
export const blockCentre: [number, number, number] = [blockSize[0] / 2, blockSize[1] / 2, blockSize[2] / 2];

export function freeBlock(springs?: { node: number; component: number; stiffness: number }[]): GeneratedModel {
  return buildHexBox({ sizeM: blockSize, elements: [2, 2, 3], material: STEEL, ...(springs ? { springs } : {}) });
}

export function freeBlockContext(withModes = false): RuleContext {
  const block = freeBlock();
  return geometryContext(block, withModes ? denseModes(block.stiffness, block.mass, 10) : undefined);
}

/** A cantilever 2 m long (12 beam elements), clamped at one end. */
export function cantilever(): GeneratedModel {
  return buildCantilever({ lengthM: 2, elements: 12, widthM: 0.05, depthM: 0.08 });
}

/** The context without geometry facts (no DOF map given). */
export function withoutGeometry(context: RuleContext): RuleContext {
  const c = { ...context };
  delete c.geometry;
  return c;
}

export { denseModes };
