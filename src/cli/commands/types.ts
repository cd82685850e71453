/** A command of the `loopfold` command line. */
export interface CliCommand {
  name: string;
  /** One line for the usage text. */
  summary: string;
  /** Usage after the command name, e.g. "MODEL.json [--interval D] [--json]". */
  usage: string;
  /** Options it accepts, without the leading "--"; flags map to false, options with a value to true. */
  options: Record<string, boolean>;
  run(args: CliArgs, io: CliIO): Promise<number> | number;
}

export interface CliArgs {
  positional: string[];
  options: Record<string, string | true>;
}

export interface CliIO {
  out(text: string): void;
  err(text: string): void;
  readFile(path: string): string;
  writeFile(path: string, content: string): void;
  /** Write binary content (PNG, PDF); without it binary figures cannot be written. */
  writeBytes?(path: string, content: Uint8Array): void;
}

/** An error whose message is shown as the one-line reason, with exit code 2 (usage) or 1. */
export class CliError extends Error {
  constructor(message: string, readonly exitCode = 1) {
    super(message);
  }
}
