import * as assert from 'node:assert/strict';
import * as vscode from 'vscode';

/** Set by run.mjs --no-trust-flag (and desktop.mjs): the host starts in Restricted Mode. */
const restricted = process.env['ORBIT_HOST_RESTRICTED'] === '1';

describe('Workspace trust as the runner set it up', () => {
  it(`sees the workspace as ${restricted ? 'untrusted (Restricted Mode)' : 'trusted'}`, () => {
    assert.equal(vscode.workspace.isTrusted, !restricted);
  });
});
