/**
 * Geometry facts at scale: a free-free steel hex box of 20×20×20 elements (27 783 DOFs) with a
 * spring to ground at one node. Prints the time of computeGeometry without modes (rigid-body
 * vectors about the CoM, mass properties, rigid-body energy) and with 20 solved modes
 * (participation and mechanism location added), and the node the grounding check names.
 */
import { buildHexBox } from '../../fixtures/generator/hex-solid.js';
import { STEEL } from '../../fixtures/generator/sections.js';
import { solveModes } from '../../src/eigen/solve-modes.js';
import { computeGeometry } from '../../src/model/compute-geometry.js';

export default async function geometryBench(): Promise<void> {
  const probe = buildHexBox({ sizeM: [1, 1, 1], elements: [20, 20, 20], material: STEEL });
  const grounded = probe.nodes.ids[Math.floor(probe.nodes.ids.length / 3)];
  const model = buildHexBox({ sizeM: [1, 1, 1], elements: [20, 20, 20], material: STEEL, springs: [{ node: grounded, component: 2, stiffness: 1e7 }] });
  const input = { stiffness: model.stiffness, mass: model.mass, dofMap: model.dofMap };
  let t0 = performance.now();
  const plain = computeGeometry(input);
  const plainMs = performance.now() - t0;
  console.log(`hex box 20×20×20, ${model.stiffness.n} DOFs, spring to ground at node ${grounded} uz`);
  console.log(`computeGeometry without modes: ${plainMs.toFixed(0)} ms; max relative energy ${plain.rigidBodyEnergy.maxRelativeEnergy.toExponential(2)}, first named node ${plain.rigidBodyEnergy.largestResiduals[0]?.node}`);
  t0 = performance.now();
  const modes = solveModes(model.stiffness, model.mass, { count: 20, coordinates: model.coordinates });
  const solveMs = performance.now() - t0;
  t0 = performance.now();
  const withModes = computeGeometry({ ...input, modes, expectedRigidBodyModes: 6 });
  const modesMs = performance.now() - t0;
  console.log(`solveModes(20): ${(solveMs / 1000).toFixed(1)} s; computeGeometry with modes: ${modesMs.toFixed(0)} ms`);
  console.log(`near-zero modes ${withModes.nearZeroModes}, free rigid motions ${withModes.freeRigidBodyMotions}, max relative energy ${withModes.rigidBodyEnergy.maxRelativeEnergy.toExponential(2)}, first named node ${withModes.rigidBodyEnergy.largestResiduals[0]?.node}`);
}
