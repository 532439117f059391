/**
 * The parts of rule results the reporters show beyond message, measured and limit, read with a
 * typed accessor per rule id. A rule's `details` is open JSON (every key goes to the JSON
 * report); the few keys a plot or a summary line depends on are read here only, checked at run
 * time, so a reporter never casts `details`, and test/pipeline/rule-details.test.ts runs the
 * rules and fails when one of them stops writing a key read here (a renamed key would otherwise
 * drop a plot line without a sound).
 */
import type { RuleResult } from '../rules/engine.js';

/** A flagged mode of a regression rule: its baseline mode, or its current mode when it has no partner. */
export interface FlaggedMode {
  baselineMode?: number;
  currentMode?: number;
}

/** The regression rules whose details list flagged modes (`details.flagged`). */
export const FLAGGING_RULES = ['frequency-drift', 'mode-shape-match', 'mode-swap', 'new-or-lost-modes'] as const;
export type FlaggingRule = (typeof FLAGGING_RULES)[number];

/** first-elastic-frequency: the first elastic frequency and the band it was held to. */
export function firstElasticDetails(r: RuleResult | undefined): { frequencyHz?: number; minHz?: number; maxHz?: number } {
  const d = detailsOf(r, 'first-elastic-frequency');
  return { frequencyHz: finite(d?.frequencyHz), minHz: finite(d?.minHz), maxHz: finite(d?.maxHz) };
}

/** rigid-body-modes: how many leading modes it counted as rigid-body modes (or mechanisms). */
export function rigidBodyModeCount(r: RuleResult | undefined): number | undefined {
  return finite(detailsOf(r, 'rigid-body-modes')?.count);
}

/** eigen-residual: the relative residual of every mode, when it ran. */
export function relativeResiduals(r: RuleResult | undefined): number[] | undefined {
  const v = detailsOf(r, 'eigen-residual')?.relativeResiduals;
  return Array.isArray(v) && v.every((x) => typeof x === 'number') ? v : undefined;
}

/** mass-participation: the directions it checks (its options) and how many modes it counted. */
export function participationDetails(r: RuleResult | undefined): { directions?: string[]; modesConsidered?: number } {
  if (r?.ruleId !== 'mass-participation') return {};
  const dirs = r.options.directions;
  return {
    directions: Array.isArray(dirs) && dirs.every((x) => typeof x === 'string') ? dirs : undefined,
    modesConsidered: finite(r.details?.modesConsidered),
  };
}

/** A regression rule's flagged modes (empty for any other rule, or when it lists none). */
export function flaggedModes(r: RuleResult | undefined): FlaggedMode[] {
  if (!r || !(FLAGGING_RULES as readonly string[]).includes(r.ruleId)) return [];
  const list = r.details?.flagged;
  if (!Array.isArray(list)) return [];
  return list.filter(isRecord).map((f) => ({ baselineMode: finite(f.baselineMode), currentMode: finite(f.currentMode) }));
}

function detailsOf(r: RuleResult | undefined, ruleId: string): Record<string, unknown> | undefined {
  return r?.ruleId === ruleId ? r.details : undefined;
}

function finite(x: unknown): number | undefined {
  return typeof x === 'number' && Number.isFinite(x) ? x : undefined;
}

function isRecord(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}
