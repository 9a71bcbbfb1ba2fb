import * as assert from 'node:assert/strict';
import * as vscode from 'vscode';

const extensionId = 'orbit-notes.orbit-notes';

describe('Activation in a real VS Code host', () => {
  it('activates the extension and registers the show-output command', async () => {
    const extension = vscode.extensions.getExtension(extensionId);
    assert.ok(extension, `extension ${extensionId} is loaded from the development path`);
    await extension.activate();
    assert.equal(extension.isActive, true);
    const commands = await vscode.commands.getCommands(true);
    assert.ok(commands.includes('orbitNotes.showOutput'), 'orbitNotes.showOutput is registered');
  });

  it('renders Markdown through the built-in preview engine', async () => {
    const html = await vscode.commands.executeCommand<string>('markdown.api.render', '# Heading\n\nplain *text*');
    assert.match(html, /<h1[^>]*>Heading<\/h1>/);
    assert.match(html, /<em>text<\/em>/);
  });
});
