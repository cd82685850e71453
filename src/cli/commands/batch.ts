/**
 * `loopfold batch FIGURES.json`: many figures, tables and reports in one
 * process (the start-up, the model files and ELK are paid for once). The
 * file lists jobs, each a command line as an array of words or as an object:
 *
 *   { "jobs": [
 *       ["render", "model.json", "--interval", "1 day", "--width", "column", "--out", "day.pdf"],
 *       { "command": "order", "model": "model.json", "options": { "interval": "3h", "json": true }, "stdout": "order.json" }
 *   ] }
 *
 * Paths (the model, --out and other file options, "stdout") are taken
 * relative to the folder of FIGURES.json. A job's printed output goes to its
 * "stdout" file when given, else to the terminal. Every job runs even when an
 * earlier one fails; the exit code is the worst of them.
 */
import { dirname, isAbsolute, join } from 'node:path';
import { CliError, type CliCommand, type CliIO } from './types';
import { fixedText } from '../../present/index';

/** Options that name files, resolved against the batch file's folder. */
const FILE_OPTIONS = new Set(['out', 'svg', 'trajectory', 'bands-csv', 'breakpoints-csv']);

interface JobObject {
  command: string;
  model?: string;
  options?: Record<string, string | number | boolean>;
  stdout?: string;
}

/** A job as the words of a command line. */
export function jobArgv(job: unknown, index: number): { argv: string[]; stdout?: string } {
  const where = `jobs[${index}]`;
  if (Array.isArray(job)) {
    if (job.length === 0 || !job.every((w) => typeof w === 'string')) throw new CliError(`${where}: a job given as a list must be the words of a command line, e.g. ["order", "model.json", "--interval", "3h"]`);
    return { argv: job as string[] };
  }
  if (!job || typeof job !== 'object') throw new CliError(`${where}: a job is a list of words or an object with "command"`);
  const j = job as JobObject;
  if (typeof j.command !== 'string') throw new CliError(`${where}.command: name a command, e.g. "render"`);
  if (j.command === 'batch') throw new CliError(`${where}.command: a batch cannot run another batch`);
  const argv = [j.command];
  if (j.model !== undefined) {
    if (typeof j.model !== 'string') throw new CliError(`${where}.model: give the model file's path as text`);
    argv.push(j.model);
  }
  for (const [k, v] of Object.entries(j.options ?? {})) {
    if (v === false) continue;
    if (v === true) argv.push(`--${k}`);
    else if (typeof v === 'string' || typeof v === 'number') argv.push(`--${k}`, String(v));
    else throw new CliError(`${where}.options.${k}: give text, a number or true`);
  }
  if (j.stdout !== undefined && typeof j.stdout !== 'string') throw new CliError(`${where}.stdout: give a file name`);
  return { argv, stdout: j.stdout };
}

/** The words with the model and file options resolved against `base`. */
export function resolvePaths(argv: string[], base: string): string[] {
  const at = (p: string) => (p === '-' || isAbsolute(p) ? p : join(base, p));
  const out = [...argv];
  let positional = 0;
  for (let i = 1; i < out.length; i++) {
    const w = out[i];
    if (w.startsWith('--')) {
      const eq = w.indexOf('=');
      const name = eq >= 0 ? w.slice(2, eq) : w.slice(2);
      if (!FILE_OPTIONS.has(name)) continue;
      if (eq >= 0) out[i] = `--${name}=${at(w.slice(eq + 1))}`;
      else if (i + 1 < out.length) { out[i + 1] = at(out[i + 1]); i++; }
      continue;
    }
    // the first word after the command is the model file; option values of other options are skipped
    const prev = out[i - 1];
    if (prev.startsWith('--') && !prev.includes('=')) continue;
    if (positional++ === 0) out[i] = at(w);
  }
  return out;
}

export function batchCommand(run: (argv: string[], io: CliIO) => Promise<number>): CliCommand {
  return {
    name: 'batch',
    summary: 'make a list of figures, tables and reports in one process (jobs in a JSON file)',
    usage: 'FIGURES.json   (jobs: [["render", "m.json", "--interval", "1 day", "--out", "a.pdf"], {"command": "order", "model": "m.json", "options": {"json": true}, "stdout": "o.json"}])',
    options: {},
    async run(args, io) {
      const path = args.positional[0];
      if (!path) throw new CliError('name the batch file, e.g. loopfold batch figures.json', 2);
      let text: string;
      try {
        text = io.readFile(path);
      } catch (e) {
        throw new CliError(`cannot read ${path}: ${(e as Error).message}`);
      }
      let doc: unknown;
      try {
        doc = JSON.parse(text);
      } catch (e) {
        throw new CliError(`${path} is not JSON: ${(e as Error).message}`);
      }
      const jobs = Array.isArray(doc) ? doc : (doc as { jobs?: unknown })?.jobs;
      if (!Array.isArray(jobs) || jobs.length === 0) throw new CliError(`${path}: give a list of jobs, as { "jobs": [ … ] }`);
      const planned = jobs.map((j, i) => jobArgv(j, i));
      const base = dirname(path);
      // model files are read once for all jobs
      const read = new Map<string, string>();
      const cachedRead = (p: string) => {
        let t = read.get(p);
        if (t === undefined) { t = io.readFile(p); read.set(p, t); }
        return t;
      };
      let worst = 0;
      const t0 = Date.now();
      for (let i = 0; i < planned.length; i++) {
        const { argv, stdout } = planned[i];
        const words = resolvePaths(argv, base);
        const printed: string[] = [];
        const jobIo: CliIO = {
          ...io,
          readFile: cachedRead,
          out: stdout === undefined ? io.out : (t) => { printed.push(t.endsWith('\n') ? t : `${t}\n`); },
          err: (t) => io.err(`[${i + 1}/${planned.length} ${argv[0]}] ${t}`),
        };
        const code = await run(words, jobIo);
        if (stdout !== undefined && code === 0) {
          const target = isAbsolute(stdout) ? stdout : join(base, stdout);
          io.writeFile(target, printed.join(''));
          io.err(`[${i + 1}/${planned.length} ${argv[0]}] wrote ${target} (${new TextEncoder().encode(printed.join('')).length} bytes)`);
        }
        worst = Math.max(worst, code);
      }
      io.err(`batch: ${planned.length} jobs in ${fixedText((Date.now() - t0) / 1000, 1)} s${worst ? ', some failed' : ''}`);
      return worst;
    },
  };
}
