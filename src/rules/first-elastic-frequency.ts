/**
 * first-elastic-frequency: the first mode above the rigid-body cutoff is at least `minHz`
 * (and, when given, at most `maxHz`). A minimum first frequency is the usual stiffness
 * requirement on a supported structure (the number itself comes from the project's spec).
 */
import type { RuleDefinition } from './rule-types.js';
import { ruleMessages } from './utils/outcome.js';
import { modeLocation } from '../model/mechanism-localization.js';
import { motionMessages, sharesText } from './utils/motion-text.js';
import { cutoffDefaults, cutoffMessages, cutoffPhrase, cutoffSchemaProperties, splitRigidBodyModes, type RigidBodyCutoffOptions } from './utils/rigid-body-split.js';

export interface FirstElasticFrequencyOptions extends RigidBodyCutoffOptions {
  minHz: number;
  maxHz?: number;
}

const messages = {
  ...cutoffMessages,
  ...motionMessages,
  pass: 'first elastic mode (mode {{mode}}) at {{hz}} Hz, within {{range}}.',
  low: 'first elastic mode (mode {{mode}}) at {{hz}} Hz is below the required minimum of {{minHz}} Hz.{{location}}',
  high: 'first elastic mode (mode {{mode}}) at {{hz}} Hz is above the allowed maximum of {{maxHz}} Hz.{{location}}',
  location: ' The mode lives at {{nodes}} (share of its kinetic energy, with the component split).',
  rangeMin: '≥ {{minHz}} Hz',
  rangeMinMax: '{{minHz}}..{{maxHz}} Hz',
  none: 'no elastic mode among the {{count}} solved modes (all are {{phrase}}): solve more modes.',
};
const { outcome, text } = ruleMessages(messages);

export const firstElasticFrequency: RuleDefinition<FirstElasticFrequencyOptions, 'minHz'> = {
  id: 'first-elastic-frequency',
  description: 'The first mode above the rigid-body cutoff is at least minHz (and at most maxHz when given).',
  optionsSchema: {
    type: 'object',
    properties: {
      minHz: { type: 'number', minimum: 0 },
      maxHz: { type: 'number', exclusiveMinimum: 0 },
      ...cutoffSchemaProperties,
    },
    required: ['minHz'],
    additionalProperties: false,
  },
  defaults: { ...cutoffDefaults },
  messages,
  needs: ['modes'],
  evaluate(context, o) {
    const f = context.modes!.frequenciesHz;
    const split = splitRigidBodyModes(f, o);
    if (split.firstElasticIndex === null) {
      return outcome('error', 'none', { count: f.length, phrase: cutoffPhrase(split) }, null, o.minHz);
    }
    const hz = f[split.firstElasticIndex];
    const values = {
      mode: split.firstElasticIndex + 1,
      hz,
      minHz: o.minHz,
      maxHz: o.maxHz ?? Infinity,
      // the limits as the config wrote them (String, not the 4-digit message format)
      range: o.maxHz !== undefined ? text('rangeMinMax', { minHz: String(o.minHz), maxHz: String(o.maxHz) }) : text('rangeMin', { minHz: String(o.minHz) }),
    };
    const details = { mode: split.firstElasticIndex + 1, frequencyHz: hz, rigidBodyModes: split.count, minHz: o.minHz, maxHz: o.maxHz ?? null };
    const located = (id: 'low' | 'high', limit: number) => {
      // where the failing mode lives: its top nodes (DOFs without a map) by kinetic energy
      const where = modeLocation(context.mass, context.modes!, split.firstElasticIndex!, context.dofMap, 5);
      const location = where.length > 0 ? text('location', { nodes: sharesText(where, 3) }) : '';
      return outcome('fail', id, { ...values, location }, hz, limit, { ...details, location: where });
    };
    if (hz < o.minHz) return located('low', o.minHz);
    if (o.maxHz !== undefined && hz > o.maxHz) return located('high', o.maxHz);
    return outcome('pass', 'pass', values, hz, o.minHz, { ...details, minHz: o.minHz, maxHz: o.maxHz ?? null });
  },
};
