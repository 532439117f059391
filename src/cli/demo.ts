import type { Command } from 'commander';

/** Placeholder: the `demo` command is being written. */
export function registerDemo(_program: Command): void {}
