import * as assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { Commands, LENS_ONLY_COMMANDS } from '../../extension/commandIds.js';

interface Manifest {
  activationEvents?: string[];
  capabilities?: Record<string, { supported: boolean | string; description?: string }>;
  contributes: {
    commands: Array<{ command: string; title: string; category?: string }>;
    menus?: { commandPalette?: Array<{ command: string; when?: string }> };
    configuration?: { properties: Record<string, { type: string; default: unknown; description: string; scope?: string }> };
    'markdown.markdownItPlugins'?: boolean;
    grammars?: Array<{ scopeName: string; path: string; injectTo?: string[] }>;
  };
}

const manifest = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as Manifest;

describe('The extension manifest', () => {
  it('contributes exactly the commands the registry registers', () => {
    const contributed = manifest.contributes.commands.map((c) => c.command).sort();
    assert.deepEqual(contributed, Object.values(Commands).sort());
  });

  it('gives every command the Orbit Notes category and a Title Case title', () => {
    for (const c of manifest.contributes.commands) {
      assert.equal(c.category, 'Orbit Notes', c.command);
      for (const word of c.title.split(' ').filter((w) => !['in', 'of', 'the', 'and'].includes(w))) {
        assert.match(word, /^[A-Z]/, `${c.command}: "${c.title}"`);
      }
    }
  });

  it('hides commands that need arguments from the Command Palette', () => {
    const hidden = (manifest.contributes.menus?.commandPalette ?? []).filter((m) => m.when === 'false').map((m) => m.command);
    assert.deepEqual(hidden.sort(), [...LENS_ONLY_COMMANDS].sort());
  });

  it('names every setting orbitNotes.<area>.<name> with type, default, scope and description', () => {
    const props = Object.entries(manifest.contributes.configuration?.properties ?? {});
    assert.ok(props.length > 0);
    for (const [key, p] of props) {
      assert.match(key, /^orbitNotes\.[a-z]+\.[a-zA-Z]+$/);
      assert.ok(p.type && p.default !== undefined && p.description && p.scope, key);
    }
  });

  it('activates on Markdown only and declares its workspace capabilities with reasons', () => {
    assert.deepEqual(manifest.activationEvents, ['onLanguage:markdown']);
    assert.equal(manifest.contributes['markdown.markdownItPlugins'], true);
    for (const kind of ['untrustedWorkspaces', 'virtualWorkspaces']) {
      const c = manifest.capabilities?.[kind];
      assert.ok(c, kind);
      if (c.supported === 'limited') assert.ok((c.description ?? '').length > 20, `${kind} states why`);
    }
  });

  it('contributes the orbit fence grammar as an injection into Markdown', () => {
    const grammars = manifest.contributes.grammars ?? [];
    assert.equal(grammars.length, 1);
    const g = grammars[0]!;
    assert.deepEqual(g.injectTo, ['text.html.markdown']);
    const file = JSON.parse(readFileSync(new URL(`../../${g.path}`, import.meta.url), 'utf8')) as { scopeName: string; injectionSelector?: string };
    assert.equal(file.scopeName, g.scopeName);
    assert.equal(file.injectionSelector, 'L:markup.fenced_code.block.markdown');
  });
});
