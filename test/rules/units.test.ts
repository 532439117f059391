/**
 * `units:` of the config: mass and length names in the messages of total-mass, center-of-mass,
 * mass-drift, mass-participation and mass-consistency, mass targets in the named unit with a mass
 * scale, and no change at all without units. References: the homogeneous steel block's mass ρV
 * and its centroid at its centre (geometry-context.ts, handbook geometry); 1 t = 1000 kg and
 * 1 kg = 1000 g (SI, common practice).
 */
import { describe, expect, it } from 'vitest';
import { totalMass } from '../../src/rules/total-mass.js';
import { centerOfMass } from '../../src/rules/center-of-mass.js';
import { massDrift } from '../../src/rules/mass-drift.js';
import { massConsistency } from '../../src/rules/mass-consistency.js';
import type { RuleContext } from '../../src/rules/rule-types.js';
import type { ReportUnits } from '../../src/rules/utils/units.js';
import { blockCentre, blockMassKg, freeBlockContext } from './geometry-context.js';
import { comparison } from './comparison-context.js';
import { runRule } from './rule-tester.js';

const tonnes: ReportUnits = { length: 'm', mass: 't', massScale: 1000 };
const inUnits = (units?: ReportUnits): RuleContext => ({ ...freeBlockContext(), ...(units ? { units } : {}) });
/** A number as the messages write it (4 significant digits). */
const f = (x: number) => String(Number(x.toPrecision(4)));
const blockTonnes = blockMassKg / 1000;

describe('total-mass with units', () => {
  it('without units the message and limit are as before: plain numbers in the model unit', () => {
    const o = runRule(totalMass, inUnits(), { expected: blockMassKg });
    expect(o.status).toBe('pass');
    expect(o.message).toMatch(new RegExp(`^total mass ${f(blockMassKg)} of the export is within 1 % of the expected ${f(blockMassKg)} \\(`));
    expect(o.limit).toBe(`${blockMassKg} ± 1 %`);
    expect(o.measured).toBeCloseTo(blockMassKg, 9);
    expect(o.details).not.toHaveProperty('units');
  });

  it('a kg model reported in t (massScale 1000): "total mass 0.2355 t", the target in t passes', () => {
    const o = runRule(totalMass, inUnits(tonnes), { expected: blockTonnes });
    expect(o.status).toBe('pass');
    expect(o.message).toMatch(new RegExp(`^total mass ${f(blockTonnes)} t of the export is within 1 % of the expected ${f(blockTonnes)} t \\(`));
    expect(o.limit).toBe(`${blockTonnes} t ± 1 %`);
    expect(o.measured).toBeCloseTo(blockTonnes, 12);
    expect(o.details).toMatchObject({ units: tonnes, totalMassInUnits: expect.closeTo(blockTonnes, 12) });
    expect(o.details!.totalMass).toBeCloseTo(blockMassKg, 9); // the facts stay in the model's unit
  });

  it('in t, 2 % over fails at 1 % and passes at 3 %; the kg figure given as a t target fails by a factor 1000', () => {
    const over = runRule(totalMass, inUnits(tonnes), { expected: blockTonnes * 1.02 });
    expect(over.status).toBe('fail');
    expect(over.details!.deviationPercent).toBeCloseTo(100 * (1 / 1.02 - 1), 6);
    expect(over.message).toContain(`differs from the expected ${f(blockTonnes * 1.02)} t by`);
    expect(runRule(totalMass, inUnits(tonnes), { expected: blockTonnes * 1.02, tolerancePercent: 3 }).status).toBe('pass');
    const wrongUnit = runRule(totalMass, inUnits(tonnes), { expected: blockMassKg });
    expect(wrongUnit.status).toBe('fail');
    expect(wrongUnit.details!.deviationPercent).toBeCloseTo(100 * (1 / 1000 - 1), 6);
  });

  it('a scale below 1 (model in t, reported in kg: 0.001) and a name without a scale', () => {
    // the same block's matrices read as if in t: m = ρV "t", reported ×1000 in kg
    const g = runRule(totalMass, inUnits({ mass: 'kg', massScale: 0.001 }), { expected: blockMassKg * 1000 });
    expect(g.status).toBe('pass');
    expect(g.message).toContain(`total mass ${f(blockMassKg * 1000)} kg of the export`);
    const named = runRule(totalMass, inUnits({ mass: 'kg' }), { expected: blockMassKg });
    expect(named.status).toBe('pass');
    expect(named.message).toContain(`total mass ${f(blockMassKg)} kg of the export`);
  });
});

describe('lengths and the other mass rules', () => {
  it('center-of-mass names the length unit; without units the message is as before', () => {
    const shifted: [number, number, number] = [blockCentre[0] + 0.01, blockCentre[1], blockCentre[2]];
    const o = runRule(centerOfMass, inUnits(tonnes), { expected: shifted, maxDistance: 0.005 });
    expect(o.status).toBe('fail');
    expect(o.message).toBe(`centre of mass (${blockCentre.map(f).join(', ')}) m is 0.01 m from the expected (${shifted.map(f).join(', ')}) m; allowed 0.005 m.`);
    const plain = runRule(centerOfMass, inUnits(), { expected: shifted, maxDistance: 0.005 });
    expect(plain.message).toBe(`centre of mass (${blockCentre.map(f).join(', ')}) is 0.01 from the expected (${shifted.map(f).join(', ')}); allowed 0.005.`);
    expect(plain.limit).toBe(o.limit);
  });

  it('mass-drift: masses in t, the shift and radius of gyration in m', () => {
    const c = inUnits(tonnes);
    const before = { ...structuredClone(c.geometry!.massProperties), totalMass: c.geometry!.massProperties.totalMass * 0.9 };
    const o = runRule(massDrift, { ...c, comparison: comparison({ baselineMassProperties: before }) });
    expect(o.status).toBe('fail');
    expect(o.message).toContain(`total mass ${f(blockTonnes * 0.9)} t → ${f(blockTonnes)} t (+${f(100 * (1 / 0.9 - 1))} %, allowed ± 1 %)`);
    const same = runRule(massDrift, { ...c, comparison: comparison({ baselineMassProperties: c.geometry!.massProperties }) });
    expect(same.message).toMatch(new RegExp(`^mass properties agree with the baseline: total mass ${f(blockTonnes)} t \\(0 %\\), centre of mass moved 0 m \\(0 % of the radius of gyration [0-9.]+ m\\)`));
    const plain = runRule(massDrift, { ...inUnits(), comparison: comparison({ baselineMassProperties: c.geometry!.massProperties }) });
    expect(plain.message).toMatch(new RegExp(`^mass properties agree with the baseline: total mass ${f(blockMassKg)} \\(0 %\\), centre of mass moved 0 \\(0 % of the radius of gyration [0-9.]+\\)`));
  });

  it('mass-consistency writes the translational masses in t', () => {
    const o = runRule(massConsistency, inUnits(tonnes));
    expect(o.status).toBe('pass');
    const m = (blockTonnes).toPrecision(6);
    expect(o.message).toMatch(new RegExp(`^translational masses agree: ux ${m} t, uy ${m} t, uz ${m} t \\(`));
    expect(runRule(massConsistency, inUnits()).message).toMatch(new RegExp(`^translational masses agree: ux ${blockMassKg.toPrecision(6)}, uy`));
  });
});
