import type { Command } from 'commander';

/** Placeholder: the `modes` command is being written. */
export function registerModes(_program: Command): void {}
