/**
 * The rigid-body split as the rules show it: the cutoff phrase of their messages, as templates
 * rules spread into their own `messages`. The split itself is model knowledge
 * (src/model/rigid-body-split.ts), re-exported here for the rules.
 */
import { ruleMessages } from './outcome.js';
import type { RigidBodySplit } from '../../model/rigid-body-split.js';

export { cutoffDefaults, cutoffSchemaProperties, splitRigidBodyModes, type CutoffBasis, type RigidBodyCutoffOptions, type RigidBodySplit } from '../../model/rigid-body-split.js';

/** Templates of the cutoff phrase; rules that show it spread them into their own `messages`. */
export const cutoffMessages = {
  cutoffRatio: 'below {{ratio}} × the first elastic frequency ({{hz}} Hz)',
  cutoffHz: 'below {{hz}} Hz',
};
const { text } = ruleMessages(cutoffMessages);

/** "below 0.005 Hz" or "below 0.0001 × the first elastic frequency (12.3 Hz)". */
export function cutoffPhrase(split: RigidBodySplit): string {
  if (split.ratio) return text('cutoffRatio', { ratio: String(split.ratio.cutoffRatio), hz: fmtHz(split.ratio.firstElasticHz) });
  return text('cutoffHz', { hz: String(split.cutoffHz) });
}

function fmtHz(x: number): string {
  return String(Number(x.toPrecision(4)));
}
