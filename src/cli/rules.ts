import type { Command } from 'commander';

/** Placeholder: the `rules` command is being written. */
export function registerRules(_program: Command): void {}
