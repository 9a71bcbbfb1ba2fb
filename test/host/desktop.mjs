#!/usr/bin/env node
// Second runner for contributors with a desktop VS Code: the same suite through
// @vscode/test-electron. It downloads a VS Code build unless VSCODE_EXECUTABLE names a
// local one (this project's CI has no such download and uses test/host/run.mjs instead).
//
//   VSCODE_EXECUTABLE=/path/to/code node test/host/desktop.mjs [--workspace DIR] [--no-trust-flag]
import * as path from 'node:path';
import { fileURLToPath } from 'node:url';
import { runTests } from '@vscode/test-electron';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const argv = process.argv.slice(2);
const wsIndex = argv.indexOf('--workspace');
const workspace = path.resolve(wsIndex >= 0 && argv[wsIndex + 1] ? argv[wsIndex + 1] : path.join(root, 'test/host/workspace'));
const restricted = argv.includes('--no-trust-flag');

const launchArgs = [workspace, '--disable-extensions', '--skip-welcome', '--skip-release-notes'];
if (!restricted) launchArgs.push('--disable-workspace-trust');

try {
  const code = await runTests({
    extensionDevelopmentPath: root,
    extensionTestsPath: path.join(root, 'dist/test/host/index.js'),
    launchArgs,
    extensionTestsEnv: restricted ? { ORBIT_HOST_RESTRICTED: '1' } : {},
    ...(process.env.VSCODE_EXECUTABLE ? { vscodeExecutablePath: process.env.VSCODE_EXECUTABLE } : {}),
  });
  process.exit(code);
} catch (err) {
  console.error(`desktop run failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
}
