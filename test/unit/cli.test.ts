import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { cpSync, mkdtempSync, mkdirSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

const ROOT = resolve(__dirname, '../..');
/** The CLI as shipped: the esbuild bundle (built here when missing). */
const CLI = join(ROOT, 'dist/cli.js');

function cli(args: string[], cwd: string): { code: number; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd, encoding: 'utf8', env: { ...process.env, FORCE_COLOR: '0' } });
  return { code: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

describe('the orbit-notes command line', function () {
  this.timeout(120000);
  let dir = '';
  before(() => {
    const b = spawnSync(process.execPath, ['esbuild.mjs'], { cwd: ROOT, encoding: 'utf8' });
    assert.equal(b.status, 0, b.stderr);
  });
  beforeEach(() => {
    dir = mkdtempSync(join(tmpdir(), 'orbit-cli-'));
    mkdirSync(join(dir, '.git'));
  });
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  const note = ['# t', '', '```orbit', 'body inner period 5.0931 d ± 0.0004 d', 'let p = period(inner) * 2', '```', ''].join('\n');

  it('check fails on a note without regions, passes after write, and fails again after a period changes', () => {
    writeFileSync(join(dir, 'n.md'), note);
    const before = cli(['check', 'n.md'], dir);
    assert.equal(before.code, 1, before.stdout + before.stderr);
    assert.match(before.stdout, /missing/);
    const w = cli(['write', 'n.md'], dir);
    assert.equal(w.code, 0, w.stderr);
    assert.equal(cli(['check', 'n.md'], dir).code, 0);
    const text = readFileSync(join(dir, 'n.md'), 'utf8');
    writeFileSync(join(dir, 'n.md'), text.replace('5.0931 d', '5.0932 d'));
    const after = cli(['check', 'n.md'], dir);
    assert.equal(after.code, 1);
    assert.match(after.stdout, /stale/);
    assert.match(after.stdout, /^-.*10\.1862/m, 'the diff shows the old value');
    assert.match(after.stdout, /^\+.*10\.1864/m, 'the diff shows the new value');
  });

  it('prints file:line:col: severity code: message for a bad statement and exits 2', () => {
    writeFileSync(join(dir, 'n.md'), '```orbit\nlet x = synodic(marz, earth)\n```\n');
    const r = cli(['run', 'n.md'], dir);
    assert.equal(r.code, 2);
    assert.match(r.stderr, /^n\.md:2:17: error OB203: unknown body or name `marz` — did you mean `mars`\?/m);
  });

  it('prints one JSON document with file, line, kind, summary, diagnostics and value', () => {
    writeFileSync(join(dir, 'n.md'), note);
    const r = cli(['run', 'n.md', '--json'], dir);
    assert.equal(r.code, 0, r.stderr);
    const doc = JSON.parse(r.stdout) as { statements: Array<{ file: string; line: number; kind: string; summary: string; diagnostics: unknown[]; value?: { number: number; unit: string; uncertainty: number } }> };
    const p = doc.statements.find((s) => s.kind === 'let')!;
    assert.equal(p.file, 'n.md');
    assert.equal(p.line, 5);
    assert.deepEqual(p.diagnostics, []);
    assert.equal(p.value!.unit, 'd');
    assert.ok(Math.abs(p.value!.number - 10.1862) < 1e-9);
    assert.ok(Math.abs(p.value!.uncertainty - 0.0008) < 1e-12);
  });

  it('refuses to write a page over anything but an .html file, so a note cannot be overwritten', () => {
    writeFileSync(join(dir, 'n.md'), note);
    const r = cli(['html', 'n.md', '-o', 'n.md'], dir);
    assert.equal(r.code, 2);
    assert.equal(readFileSync(join(dir, 'n.md'), 'utf8'), note);
    assert.equal(cli(['html', 'n.md', '-o', 'n.html'], dir).code, 0);
    assert.match(readFileSync(join(dir, 'n.html'), 'utf8'), /<!DOCTYPE html>[\s\S]*Content-Security-Policy[\s\S]*orbit-summary/);
  });

  it('exits 2 with the usage on an unknown command or option', () => {
    assert.equal(cli(['frobnicate'], dir).code, 2);
    const r = cli(['run', '--bogus', 'x.md'], dir);
    assert.equal(r.code, 2);
    assert.match(r.stderr, /unknown option `--bogus`/);
  });

  it('refuses a data file outside the workspace, even through a symbolic link', () => {
    const outside = mkdtempSync(join(tmpdir(), 'orbit-outside-'));
    try {
      writeFileSync(join(outside, 'secret.csv'), 't,v\n1,2\n2,3\n3,4\n');
      symlinkSync(join(outside, 'secret.csv'), join(dir, 'link.csv'));
      writeFileSync(join(dir, 'n.md'), '```orbit\nseries a from "link.csv" time t value v\nseries b from "../' + outside.split('/').pop() + '/secret.csv" time t value v\n```\n');
      const r = cli(['run', 'n.md'], dir);
      assert.equal(r.code, 2);
      assert.equal((r.stderr.match(/OB404/g) ?? []).length, 2, r.stderr);
    } finally {
      rmSync(outside, { recursive: true, force: true });
    }
  });

  it('leaves a hand-edited region alone unless --force is given', () => {
    writeFileSync(join(dir, 'n.md'), note);
    cli(['write', 'n.md'], dir);
    const written = readFileSync(join(dir, 'n.md'), 'utf8');
    const edited = written.replace('10.1862', '99.9999');
    writeFileSync(join(dir, 'n.md'), edited);
    const w = cli(['write', 'n.md'], dir);
    assert.match(w.stderr, /warning OB502: .*edited by hand/);
    assert.equal(w.code, 1, 'a region left alone is not a clean write');
    assert.equal(readFileSync(join(dir, 'n.md'), 'utf8'), edited);
    assert.equal(cli(['check', 'n.md'], dir).code, 1);
    cli(['write', 'n.md', '--force'], dir);
    assert.equal(readFileSync(join(dir, 'n.md'), 'utf8'), written);
  });

  it('writes the bundled demo notes so that check passes on them', () => {
    cpSync(resolve(__dirname, '../../examples'), join(dir, 'examples'), { recursive: true });
    const w = cli(['write', 'examples'], dir);
    assert.ok(w.code === 0 || w.code === 2, w.stderr);
    assert.equal(w.code, 0, `demo notes must evaluate without errors:\n${w.stderr}`);
    assert.equal(cli(['check', 'examples'], dir).code, 0);
  });
});

describe('the committed demo notes', function () {
  this.timeout(120000);
  before(() => {
    const b = spawnSync(process.execPath, ['esbuild.mjs'], { cwd: ROOT, encoding: 'utf8' });
    assert.equal(b.status, 0, b.stderr);
  });
  it('hold results that a fresh evaluation reproduces exactly (orbit-notes check examples)', () => {
    const r = spawnSync(process.execPath, [CLI, 'check', 'examples'], { cwd: ROOT, encoding: 'utf8' });
    assert.equal(r.status, 0, `${r.stdout}\n${r.stderr}\n(run \`npm run demo\` and commit the notes after changing what they compute)`);
  });
});
