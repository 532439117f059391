/**
 * A typed use of the library entry (src/index.ts, the package's `exports` "."), compiled by the
 * project's tsc like any test file: every exported function, with its types spelled out, on the
 * 3-DOF spring chain of test/config/models/tiny.*. test/api/library.test.ts runs it.
 */
import { join } from 'node:path';
import {
  checkModels,
  formatConsole,
  formatHtml,
  formatJson,
  formatJunit,
  formatMarkdown,
  readDofMap,
  readMatrixMarket,
  solveModes,
  type CheckReport,
  type DofMap,
  type MatrixFile,
  type ModesResult,
  type PhaseTimes,
  type RawConfig,
} from '../../src/index.js';

export interface ExampleResult {
  dofs: number;
  nodes: number;
  frequenciesHz: number[];
  report: CheckReport;
  phases: Record<string, PhaseTimes>;
  texts: { junit: string; markdown: string; html: string; json: string; console: string };
}

export async function runExample(modelsDir: string): Promise<ExampleResult> {
  // the matrices and the DOF map, read as the check reads them
  const stiffness: MatrixFile = await readMatrixMarket(join(modelsDir, 'tiny.stiffness.mtx'));
  const mass: MatrixFile = await readMatrixMarket(join(modelsDir, 'tiny.mass.mtx'));
  const map: DofMap = await readDofMap(join(modelsDir, 'tiny.dofs.csv'), stiffness.matrix.n);
  // the lowest two modes, on their own
  const modes: ModesResult = solveModes(stiffness.matrix, mass.matrix, { count: 2 });
  // the whole check, from a config object with paths relative to modelsDir
  const config: RawConfig = {
    defaults: { count: 3 },
    models: [
      {
        name: 'chain',
        stiffness: 'tiny.stiffness.mtx',
        mass: 'tiny.mass.mtx',
        dofs: 'tiny.dofs.csv',
        ruleSets: ['supported'],
        rules: { 'first-elastic-frequency': { minHz: 0.5, maxHz: 100 }, conditioning: 'off', 'rigid-body-modes': { min: 0, max: 1 } },
      },
    ],
  };
  const phases: Record<string, PhaseTimes> = {};
  const report: CheckReport = await checkModels(config, modelsDir, { onPhases: (model, times) => (phases[model] = times) });
  return {
    dofs: stiffness.matrix.n,
    nodes: new Set(map.node).size,
    frequenciesHz: Array.from(modes.frequenciesHz),
    report,
    phases,
    texts: {
      junit: formatJunit(report),
      markdown: formatMarkdown(report, { allModes: true }),
      html: formatHtml(report),
      json: formatJson(report),
      console: formatConsole(report, { quiet: false }),
    },
  };
}
