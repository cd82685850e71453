#!/usr/bin/env node
/* global process */
// The `loopfold` command line, started fast: the TypeScript sources are bundled once into
// .cache/loopfold-cli/ (esbuild, about a second) and the bundle is run; the bundle is made again
// whenever a source file is newer than it, so a fresh clone after `npm ci` and every edit of
// src/ stay true without an install script. `npm run -s loopfold -- …` runs this file.
import { existsSync, mkdirSync, readdirSync, renameSync, rmSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const cacheDir = join(root, '.cache', 'loopfold-cli');

/** The newest modification time of the files under src/ (and this launcher's package.json). */
function newestSource() {
  let newest = statSync(join(root, 'package.json')).mtimeMs;
  const walk = (dir) => {
    for (const d of readdirSync(dir, { withFileTypes: true })) {
      const p = join(dir, d.name);
      if (d.isDirectory()) walk(p);
      else if (/\.(ts|tsx|json|mjs|js)$/.test(d.name)) newest = Math.max(newest, statSync(p).mtimeMs);
    }
  };
  walk(join(root, 'src'));
  return newest;
}

/** Bundle the sources into `outDir` (built aside and renamed, so a process running an older bundle is never disturbed). */
async function build(outDir) {
  const { build: esbuild } = await import('esbuild');
  const tmp = `${outDir}.${process.pid}.tmp`;
  rmSync(tmp, { recursive: true, force: true });
  await esbuild({
    entryPoints: [join(root, 'src', 'cli', 'main.ts')],
    outdir: tmp,
    outExtension: { '.js': '.mjs' },
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    logLevel: 'error',
    // native code, font files and data read next to their own modules stay in node_modules
    external: ['@resvg/resvg-js', 'pdfkit', 'fontkit', 'dejavu-fonts-ttf', 'esbuild'],
    banner: { js: "import { createRequire as __lfRequire } from 'node:module'; const require = __lfRequire(import.meta.url);" },
  });
  try {
    renameSync(tmp, outDir);
  } catch {
    rmSync(tmp, { recursive: true, force: true }); // another process made the same bundle first
  }
  // bundles of older sources: removed when nothing holds them (a failure here changes nothing)
  for (const d of readdirSync(cacheDir)) if (join(cacheDir, d) !== outDir && !d.endsWith('.tmp')) rmSync(join(cacheDir, d), { recursive: true, force: true });
}

if (process.env.LOOPFOLD_NO_BUNDLE !== '1') {
  const outDir = join(cacheDir, String(Math.floor(newestSource())));
  const entry = join(outDir, 'main.mjs');
  if (!existsSync(entry)) {
    mkdirSync(cacheDir, { recursive: true });
    await build(outDir);
  }
  await import(pathToFileURL(entry).href);
} else {
  // run the sources directly (slower start): tsx compiles them on the fly
  const { register } = await import('tsx/esm/api');
  register();
  await import(pathToFileURL(join(root, 'src', 'cli', 'main.ts')).href);
}
