import type { Command } from 'commander';

/** Placeholder: the `check` command is being written. */
export function registerCheck(_program: Command): void {}
