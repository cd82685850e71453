import { readFileSync } from 'node:fs';
import type { CliIO } from '../../src/cli/commands/types';

/**
 * An in-memory terminal for `runCli`: what the command prints, and files it
 * reads from `files` first (then from disk unless `disk: false`) and writes into `files`.
 */
export function memoryIo(files: Record<string, string> = {}, options: { disk?: boolean } = {}): { out: string[]; err: string[]; files: Record<string, string>; bytes: Record<string, Uint8Array>; io: CliIO } {
  const out: string[] = [];
  const bytes: Record<string, Uint8Array> = {};
  const err: string[] = [];
  const disk = options.disk ?? true;
  return {
    out,
    err,
    files,
    bytes,
    io: {
      out: (t) => { out.push(t); },
      err: (t) => { err.push(t); },
      readFile: (p) => {
        if (p in files) return files[p];
        if (!disk) throw Object.assign(new Error('no such file'), { code: 'ENOENT' });
        return readFileSync(p, 'utf8');
      },
      writeFile: (p, c) => { files[p] = c; },
      writeBytes: (p, c) => { bytes[p] = c; },
    },
  };
}
