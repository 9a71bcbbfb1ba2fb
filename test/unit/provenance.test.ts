import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { ASTRONOMY_ENGINE_VERSION, ORBIT_NOTES_VERSION } from '../../compute/provenance.js';

const root = join(__dirname, '../..');
const versionOf = (pkgDir: string): string => (JSON.parse(readFileSync(join(root, pkgDir, 'package.json'), 'utf8')) as { version: string }).version;

describe('provenance', () => {
  it('names the astronomy-engine version that is actually installed', () => {
    assert.equal(ASTRONOMY_ENGINE_VERSION, versionOf('node_modules/astronomy-engine'));
  });
  it('names the version of orbit-notes in package.json', () => {
    assert.equal(ORBIT_NOTES_VERSION, versionOf('.'));
  });
});
