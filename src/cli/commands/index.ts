import type { CliCommand } from './types';

/** Every command of the command line; each module adds its own entries here. */
export const COMMANDS: CliCommand[] = [];
