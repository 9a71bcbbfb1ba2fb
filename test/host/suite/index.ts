/**
 * The integration suite's entry, loaded by VS Code through `extensionTestsPath`
 * (see VSCODE-HOST.md). Runs mocha over the compiled `*.test.js` files beside this one
 * and rejects when any test fails. The closing `N passed, N failed` line is what the
 * runners (run.mjs, desktop.mjs) look for.
 */
import * as fs from 'node:fs';
import * as path from 'node:path';
import Mocha from 'mocha';

/** Mocha's per-test timeout inside the host; waits in tests have their own shorter limits. */
const testTimeoutMs = 30_000;

/** Runs the suite; resolves when every test passed, rejects with the failure count otherwise. */
export async function run(): Promise<void> {
  const mocha = new Mocha({ ui: 'bdd', color: false, timeout: testTimeoutMs, reporter: 'spec' });
  const here = __dirname;
  const grep = process.env['ORBIT_HOST_GREP'];
  if (grep) mocha.grep(grep);
  const files = fs.readdirSync(here, { recursive: true, encoding: 'utf8' })
    .filter((f) => f.endsWith('.test.js'))
    .sort();
  for (const f of files) mocha.addFile(path.join(here, f));
  if (files.length === 0) throw new Error(`no *.test.js files under ${here}`);

  console.log('orbit-notes host suite: start');
  const counts = await new Promise<{ passed: number; failed: number }>((resolve) => {
    const runner = mocha.run(() => {
      resolve({ passed: runner.stats?.passes ?? 0, failed: runner.stats?.failures ?? 0 });
    });
  });
  console.log(`${counts.passed} passed, ${counts.failed} failed`);
  if (counts.failed > 0) throw new Error(`${counts.failed} integration test(s) failed`);
}
