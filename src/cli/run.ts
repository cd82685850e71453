import { COMMANDS } from './commands/index';
import { CliError, type CliArgs, type CliCommand, type CliIO } from './commands/types';

export function usage(): string {
  const lines = ['usage: loopfold COMMAND MODEL.json [options]', '', 'commands:'];
  for (const c of COMMANDS) lines.push(`  ${c.name.padEnd(12)} ${c.summary}`, `  ${' '.repeat(12)} loopfold ${c.name} ${c.usage}`);
  return lines.join('\n');
}

/** Parse `--name value`, `--name=value` and `--flag` against the command's option table. */
export function parseArgs(cmd: CliCommand, argv: string[]): CliArgs {
  const positional: string[] = [];
  const options: Record<string, string | true> = {};
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (!a.startsWith('--')) { positional.push(a); continue; }
    const eq = a.indexOf('=');
    const name = eq >= 0 ? a.slice(2, eq) : a.slice(2);
    if (!(name in cmd.options)) throw new CliError(`unknown option --${name} for "${cmd.name}" (usage: loopfold ${cmd.name} ${cmd.usage})`, 2);
    if (!cmd.options[name]) {
      if (eq >= 0) throw new CliError(`--${name} takes no value`, 2);
      options[name] = true;
      continue;
    }
    const value = eq >= 0 ? a.slice(eq + 1) : argv[++i];
    if (value === undefined) throw new CliError(`--${name} needs a value (usage: loopfold ${cmd.name} ${cmd.usage})`, 2);
    if (name === 'hold' && typeof options[name] === 'string') options[name] = `${options[name]},${value}`;
    else options[name] = value;
  }
  return { positional, options };
}

/** Run the command line; returns the exit code. Errors become one-line reasons. */
export async function runCli(argv: string[], io: CliIO): Promise<number> {
  const [name, ...rest] = argv;
  if (!name || name === '--help' || name === 'help' || name === '-h') {
    io.out(usage());
    return name ? 0 : 2;
  }
  const cmd = COMMANDS.find((c) => c.name === name);
  if (!cmd) {
    io.err(`loopfold: unknown command "${name}"; commands: ${COMMANDS.map((c) => c.name).join(', ')}`);
    return 2;
  }
  try {
    return await cmd.run(parseArgs(cmd, rest), io);
  } catch (e) {
    if (e instanceof CliError) {
      io.err(`loopfold ${cmd.name}: ${e.message}`);
      return e.exitCode;
    }
    io.err(`loopfold ${cmd.name}: internal error: ${(e as Error).message}`);
    return 3;
  }
}
