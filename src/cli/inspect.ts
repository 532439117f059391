import type { Command } from 'commander';

/** Placeholder: the `inspect` command is being written. */
export function registerInspect(_program: Command): void {}
