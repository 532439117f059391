import { modesComplete } from '../../src/rules/modes-complete.js';
import { chainContext, exactModes } from './fake-model.js';
import { groundedChain } from './reference-chains.js';
import { testRule } from './rule-tester.js';

const chain = groundedChain();
const withSturm = (countBelow: (returned: number) => number, ok = true) => () => {
  const modes = exactModes(chain);
  modes.sturm = { ...modes.sturm, countBelow: countBelow(modes.sturm.modesReturned), ok };
  return chainContext(chain, modes);
};

// Sturm count = number of eigenvalues below σ (Sylvester's law of inertia; docs/sources.md)
testRule(modesComplete, {
  valid: [
    { name: 'the count equals the modes returned', context: withSturm((r) => r), messageId: 'pass', measured: 5, limit: 5 },
    {
      name: 'a cluster extension is named',
      context: () => {
        const modes = exactModes(chain);
        modes.clusterExtension = { requested: 3, returned: 5, rigidBody: false } as never;
        return chainContext(chain, modes);
      },
      messageId: 'passCluster',
    },
  ],
  invalid: [
    { name: 'one more eigenvalue below σ than returned: a mode was missed', context: withSturm((r) => r + 1), status: 'fail', messageId: 'missed', measured: 6, limit: 5 },
    { name: 'fewer eigenvalues below σ than returned', context: withSturm((r) => r - 1), status: 'fail', messageId: 'extra' },
    { name: 'the solver could not confirm the count', context: withSturm((r) => r, false), status: 'fail', messageId: 'notOk' },
  ],
});
