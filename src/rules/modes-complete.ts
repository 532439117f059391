/**
 * modes-complete: the Sturm-sequence count proves no mode was missed. By Sylvester's law of
 * inertia the negative pivots of LDLᵀ(K − σM) equal the eigenvalues below σ (Bai et al.,
 * Templates §4, [C] docs/sources.md §3); with σ just above the last returned mode the count must
 * equal the number of modes returned.
 *
 * When the requested count ends inside a cluster of equal eigenvalues (a square tube's bending
 * pair, a symmetric tower, the six rigid-body modes) no σ separates "the lowest N": the solver
 * returns the whole cluster (ModesResult.clusterExtension) and the count past it must equal the
 * modes returned, which this rule checks and its message says. The test is the solver's own
 * (SturmCheck.ok), so `modalgate modes` and this rule agree.
 */
import type { RuleDefinition } from './rule-types.js';
import { ruleMessages } from './utils/outcome.js';

const messages = {
  pass: 'Sturm count at σ = {{shift}} is {{countBelow}}, equal to the {{returned}} modes returned: no mode was missed.',
  passCluster:
    'Sturm count at σ = {{shift}} is {{countBelow}}, equal to the {{returned}} modes returned: no mode was missed ({{requested}} requested; mode {{requested}} at {{hz}} Hz is repeated, so {{added}} more mode(s) of its cluster were returned).',
  passRigidBody:
    'Sturm count at σ = {{shift}} is {{countBelow}}, equal to the {{returned}} modes returned: no mode was missed ({{requested}} requested; mode {{requested}} is a rigid-body mode, so {{added}} more rigid-body mode(s) were returned).',
  missed:
    'Sturm count at σ = {{shift}} is {{countBelow}} but {{returned}} modes were returned: {{difference}} mode(s) below the last returned mode were missed.',
  extra: 'Sturm count at σ = {{shift}} is {{countBelow}} but {{returned}} modes were returned: the solver returned modes it cannot account for.',
  notOk: 'the solver could not confirm completeness with a Sturm count at σ = {{shift}} (count {{countBelow}}, {{returned}} modes returned).',
};
const { outcome } = ruleMessages(messages);

export const modesComplete: RuleDefinition<Record<string, never>> = {
  id: 'modes-complete',
  description: 'The Sturm-sequence (inertia) count proves no mode below the last returned one was missed.',
  optionsSchema: { type: 'object', properties: {}, additionalProperties: false },
  defaults: {},
  messages,
  needs: ['modes'],
  evaluate(context) {
    const modes = context.modes!;
    const s = modes.sturm;
    const c = modes.clusterExtension;
    const values = {
      shift: s.shift,
      countBelow: s.countBelow,
      returned: s.modesReturned,
      difference: s.countBelow - s.modesReturned,
      requested: c?.requested,
      added: c ? c.returned - c.requested : 0,
      hz: c ? modes.frequenciesHz[c.requested - 1] : undefined,
    };
    const details = { shift: s.shift, countBelow: s.countBelow, modesReturned: s.modesReturned, ...(c ? { clusterExtension: c } : {}) };
    if (s.countBelow > s.modesReturned) return outcome('fail', 'missed', values, s.countBelow, s.modesReturned, details);
    if (s.countBelow < s.modesReturned) return outcome('fail', 'extra', values, s.countBelow, s.modesReturned, details);
    if (!s.ok) return outcome('fail', 'notOk', values, s.countBelow, s.modesReturned, details);
    const pass = !c ? 'pass' : c.rigidBody ? 'passRigidBody' : 'passCluster';
    return outcome('pass', pass, values, s.countBelow, s.modesReturned, details);
  },
};
