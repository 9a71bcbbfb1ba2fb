// Bundles the CLI and the extension. `node esbuild.mjs [--watch]`.
import * as esbuild from 'esbuild';
import { existsSync, readdirSync } from 'node:fs';

const watch = process.argv.includes('--watch');
const common = { bundle: true, platform: 'node', target: 'node20', sourcemap: true, logLevel: 'warning' };
const entries = [
  { entryPoints: ['cli/main.ts'], outfile: 'dist/cli.js', banner: { js: '#!/usr/bin/env node' } },
  { entryPoints: ['extension/extension.ts'], outfile: 'dist/extension.js', external: ['vscode'], format: 'cjs' },
  { entryPoints: ['extension/worker.ts'], outfile: 'dist/worker.js', format: 'cjs' },
  // Host integration suite (test/host/run.mjs loads dist/test/host/index.js inside VS Code).
  {
    entryPoints: ['test/host/suite/index.ts', ...(existsSync('test/host/suite') ? readdirSync('test/host/suite', { recursive: true, encoding: 'utf8' }).filter((f) => f.endsWith('.test.ts')).map((f) => `test/host/suite/${f}`) : [])],
    outdir: 'dist/test/host', outbase: 'test/host/suite', external: ['vscode', 'mocha'], format: 'cjs',
  },
].filter((e) => existsSync(e.entryPoints[0]));

for (const e of entries) {
  const opts = { ...common, ...e };
  if (watch) await (await esbuild.context(opts)).watch();
  else await esbuild.build(opts);
}
