/**
 * End to end on the built CLI: the tetrahedral bracket with two wrongly joined sub-parts
 * (fixtures/generator/tet-bracket.ts — a plate sharing one line of nodes with the body, a block
 * sharing one node), unstructured, with shuffled node ids. `check` with the `supported` rule set
 * must fail `rigid-body-modes` with the 4 extra near-zero modes and name each broken sub-part —
 * the hinged plate by the line it turns about, the block by the node it rotates about — in the
 * console, the JUnit file and the Markdown summary. The kinematics are common practice: a solid
 * part held on a line of nodes keeps one rotation about that line, one held at a node keeps three.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildJointedTetBracket, type JointedBracket } from '../../fixtures/generator/tet-bracket.js';
import { writeGeneratedModel } from '../../fixtures/generator/index.js';
import { ensureBuilt, runCli, type CliRun } from './built-cli.js';

let work: string;
let jointed: JointedBracket;
let run: CliRun;

beforeAll(async () => {
  ensureBuilt();
  work = mkdtempSync(join(tmpdir(), 'modalgate-jointed-'));
  jointed = buildJointedTetBracket({ order: 1, cellM: 0.01, seed: 5 });
  await writeGeneratedModel(jointed.model, work, 'bracket');
  writeFileSync(
    join(work, 'modalgate.yaml'),
    'models:\n  - name: radio-bracket\n    stiffness: bracket.stiffness.mtx\n    mass: bracket.mass.mtx\n    dofs: bracket.dofs.csv\n    count: 10\n' +
      '    ruleSets: [supported]\n    rules:\n      first-elastic-frequency: { minHz: 1 }\n',
  );
  run = await runCli(['check', '--junit', 'out/junit.xml', '--markdown', 'out/summary.md', '--json', 'out/report.json'], work);
}, 180_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

/** A sub-part is named when the text lists one of its own nodes and says how it moves. */
function namesEveryPart(text: string): void {
  const [flap, block] = jointed.joints;
  expect(flap.zeroModes).toBe(1);
  expect(block.zeroModes).toBe(3);
  // the hinged plate: its line of joint nodes, and one rotation
  expect(text).toMatch(/turns about the line of nodes/);
  expect(flap.jointNodeIds.some((id) => new RegExp(`\\b${id}\\b`).test(text)), 'a hinge node is named').toBe(true);
  // the block: the one node it hangs on, and three rotations
  expect(text).toContain(`rotates freely about node ${block.jointNodeIds[0]} (3 free rotations)`);
}

describe('check on a bracket with two wrongly joined sub-parts', () => {
  it('fails rigid-body-modes with 4 extra near-zero modes (exit 1)', () => {
    expect(run.code, run.stderr).toBe(1);
    const report = JSON.parse(readFileSync(join(work, 'out/report.json'), 'utf8'));
    const rule = report.models[0].rules.find((r: { ruleId: string }) => r.ruleId === 'rigid-body-modes');
    expect(rule).toMatchObject({ status: 'fail', measured: jointed.expectedZeroModes, limit: 0 });
  });

  it('the console names each broken sub-part', () => namesEveryPart(run.stdout));

  it('the JUnit failure text names each broken sub-part', () => namesEveryPart(readFileSync(join(work, 'out/junit.xml'), 'utf8')));

  it('the Markdown summary names each broken sub-part', () => namesEveryPart(readFileSync(join(work, 'out/summary.md'), 'utf8')));
});
