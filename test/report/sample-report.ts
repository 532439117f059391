/** A CheckReport with every kind of outcome, for reporter tests (no solving involved). */
import type { CheckReport, ModelReport } from '../../src/pipeline/result-types.js';
import { CAUTION } from '../../src/pipeline/result-types.js';
import type { RuleResult } from '../../src/rules/engine.js';

function rule(ruleId: string, status: RuleResult['status'], message: string, extra: Partial<RuleResult> = {}): RuleResult {
  return { ruleId, description: `${ruleId} description`, severity: 'error', options: {}, status, message, timeMs: 1.234, ...extra };
}

export function sampleReport(): CheckReport {
  const good: ModelReport = {
    name: 'mast',
    verdict: 'pass',
    timestamp: '2026-12-02T06:00:00',
    timeMs: 812.5,
    ruleSets: ['free-free'],
    stats: { dofs: 1200, stiffnessNonzeros: 30000, massNonzeros: 1200, stiffnessFile: '/m/mast.stiffness.mtx', massFile: '/m/mast.mass.mtx' },
    solve: {
      method: 'lanczos',
      ordering: 'amd',
      requested: { count: 12 },
      modesReturned: 12,
      shifts: [-39.47],
      iterations: 4,
      sturm: { shift: 40123.4, countBelow: 12, modesReturned: 12, ok: true },
      factorNonzeros: 50000,
      maxDiagonalToPivotRatio: 1234,
      timings: { totalMs: 700, factorMs: 300, iterateMs: 300, verifyMs: 100 },
      massOrthogonality: 1e-15,
      stiffnessOrthogonality: 1e-14,
      warnings: ['shift moved once'],
    },
    modes: [
      { mode: 1, eigenvalue: 1e-9, frequencyHz: 5e-6, residual: 1e-14 },
      { mode: 2, eigenvalue: 5000, frequencyHz: 11.25, residual: 1e-14 },
    ],
    rules: [
      rule('rigid-body-modes', 'pass', '6 modes below 0.005 Hz, as expected (6).', { measured: 6, limit: 6 }),
      rule('conditioning', 'fail', 'ratio 3.00e8 exceeds 1.00e7', { severity: 'warning', measured: 3e8, limit: 1e7 }),
      rule('mode-frequencies', 'skip', 'no target frequencies listed (set targets: [{ mode, hz }]).'),
    ],
  };
  const bad: ModelReport = {
    name: 'mast-guyed-loose-anchor',
    verdict: 'fail',
    timestamp: '2026-12-02T06:00:01',
    timeMs: 950,
    ruleSets: ['supported'],
    stats: { dofs: 1300, stiffnessNonzeros: 31000, massNonzeros: 1300, stiffnessFile: '/m/a.mtx', massFile: '/m/b.mtx' },
    rules: [
      rule('rigid-body-modes', 'fail', '1 mode below 0.005 Hz, expected 0: the model has a mechanism or an unintended free part <&> "quoted" ]]> \u0001\u0000 bell\u0007', { measured: 1, limit: 0 }),
      rule('eigen-residual', 'error', 'not evaluated: the eigensolver stopped: no convergence'),
      rule('matrix-finite', 'pass', 'every entry of K and M is finite.', { measured: 0, limit: 0, details: { stiffness: 0, mass: 0, weird: Infinity } }),
    ],
  };
  const broken: ModelReport = {
    name: 'bracket',
    verdict: 'error',
    timestamp: '2026-12-02T06:00:02',
    timeMs: 3,
    ruleSets: ['free-free'],
    rules: [rule('matrix-finite', 'skip', "not evaluated: the model's input could not be read.")],
    problem: { kind: 'input', message: '/m/bracket.mtx:7: entry 5 has row 0; Matrix Market indices start at 1', file: '/m/bracket.mtx', line: 7 },
  };
  return {
    tool: { name: 'modalgate', version: '0.1.0' },
    configPath: '/m/modalgate.yaml',
    timestamp: '2026-12-02T06:00:00',
    timeMs: 1765.4321,
    hostname: 'ci-runner-1',
    verdict: 'error',
    caution: CAUTION,
    models: [good, bad, broken],
  };
}
