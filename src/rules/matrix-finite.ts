/**
 * matrix-finite: K and M hold no NaN or infinite entries (tool policy, [CP] docs/sources.md §4).
 *
 * `check` reads K and M with screening 'record': a value such as `nan`, `inf` or `1e400`, or
 * duplicates summing past the double range, is kept and listed with its line
 * (MatrixSummary.nonFiniteAt) instead of stopping the run, so this rule is where such a model
 * fails, naming the first entries as file:line. The solve is skipped for such a model (its
 * results would be meaningless); `inspect` and `modes` still refuse non-finite values.
 */
import type { RuleDefinition } from './rule-types.js';
import type { MatrixSummary } from '../io/matrix-summary.js';
import { ruleMessages } from './utils/outcome.js';

const messages = {
  pass: 'every entry of K and M is finite.',
  count: '{{matrix}} has {{count}}',
  location: '{{file}}{{line}} ({{row}}, {{col}})',
  line: ':{{line}}',
  unknownLocation: 'an unknown line',
  fail: '{{list}} non-finite entr{{plural}} (NaN or infinity); such values make every result meaningless; first at {{where}}.',
};
const { outcome, text } = ruleMessages(messages);


export const matrixFinite: RuleDefinition<Record<string, never>> = {
  id: 'matrix-finite',
  description: 'K and M contain no NaN or infinite entries.',
  optionsSchema: { type: 'object', properties: {}, additionalProperties: false },
  defaults: {},
  messages,
  needs: [],
  evaluate(context) {
    const k = context.stiffnessSummary.nonFiniteCount;
    const m = context.massSummary.nonFiniteCount;
    const parts = [];
    if (k > 0) parts.push(text('count', { matrix: 'K', count: String(k) }));
    if (m > 0) parts.push(text('count', { matrix: 'M', count: String(m) }));
    const where = [...locations(context.stiffnessSummary), ...locations(context.massSummary)].slice(0, 5);
    const details = { stiffness: k, mass: m, locations: where };
    if (parts.length > 0) {
      return outcome('fail', 'fail', { list: parts.join(' and '), plural: k + m === 1 ? 'y' : 'ies', where: where.length > 0 ? where.join(', ') : text('unknownLocation') }, k + m, 0, details);
    }
    return outcome('pass', 'pass', {}, 0, 0, details);
  },
};

/** "k.mtx:4 (1, 1), k.mtx:9 (3, 2)": where the first recorded entries are. */
function locations(s: MatrixSummary): string[] {
  return (s.nonFiniteAt ?? []).map((e) => text('location', { file: s.file, line: e.line > 0 ? text('line', { line: String(e.line) }) : '', row: String(e.row), col: String(e.col) }));
}
