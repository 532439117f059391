import type { Command } from 'commander';

/** Placeholder: the `init` command is being written. */
export function registerInit(_program: Command): void {}
