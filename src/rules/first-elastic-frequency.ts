/**
 * first-elastic-frequency: the first mode above the rigid-body cutoff is at least `minHz`
 * (and, when given, at most `maxHz`). A minimum first frequency is the usual stiffness
 * requirement on a supported structure (the number itself comes from the project's spec).
 */
import type { RuleDefinition } from './rule-types.js';
import { outcome } from './outcome.js';
import { modeLocation } from '../model/mechanism-localization.js';
import { formatMessage } from './message.js';
import { sharesText } from './motion-text.js';
import { cutoffDefaults, cutoffSchemaProperties, splitRigidBodyModes, type RigidBodyCutoffOptions } from '../model/rigid-body-split.js';

export interface FirstElasticFrequencyOptions extends RigidBodyCutoffOptions {
  minHz: number;
  maxHz?: number;
}

const messages = {
  pass: 'first elastic mode (mode {{mode}}) at {{hz}} Hz, within {{range}}.',
  low: 'first elastic mode (mode {{mode}}) at {{hz}} Hz is below the required minimum of {{minHz}} Hz.',
  high: 'first elastic mode (mode {{mode}}) at {{hz}} Hz is above the allowed maximum of {{maxHz}} Hz.',
  where: 'The mode lives at {{where}} (share of its kinetic energy, with the component split).',
  none: 'no elastic mode among the {{count}} solved modes (all are {{phrase}}): solve more modes.',
};

export const firstElasticFrequency: RuleDefinition<FirstElasticFrequencyOptions> = {
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
  defaults: { ...cutoffDefaults } as FirstElasticFrequencyOptions,
  messages,
  needs: ['modes'],
  evaluate(context, o) {
    const f = context.modes!.frequenciesHz;
    const split = splitRigidBodyModes(f, o);
    if (split.firstElasticIndex === null) {
      return outcome('error', messages.none, { count: f.length, phrase: split.phrase }, null, o.minHz);
    }
    const hz = f[split.firstElasticIndex];
    const values = {
      mode: split.firstElasticIndex + 1,
      hz,
      minHz: o.minHz,
      maxHz: o.maxHz ?? Infinity,
      range: o.maxHz !== undefined ? `${o.minHz}..${o.maxHz} Hz` : `≥ ${o.minHz} Hz`,
    };
    const details = { mode: split.firstElasticIndex + 1, frequencyHz: hz, rigidBodyModes: split.count, minHz: o.minHz, maxHz: o.maxHz ?? null };
    const located = (template: string, limit: number) => {
      // where the failing mode lives: its top nodes (DOFs without a map) by kinetic energy
      const where = modeLocation(context.mass, context.modes!, split.firstElasticIndex!, context.dofMap, 5);
      const failed = outcome('fail', template, values, hz, limit, { ...details, location: where });
      if (where.length > 0) failed.message += ` ${formatMessage(messages.where, { where: sharesText(where, 3) })}`;
      return failed;
    };
    if (hz < o.minHz) return located(messages.low, o.minHz);
    if (o.maxHz !== undefined && hz > o.maxHz) return located(messages.high, o.maxHz);
    return outcome('pass', messages.pass, values, hz, o.minHz, { ...details, minHz: o.minHz, maxHz: o.maxHz ?? null });
  },
};
