import * as assert from 'node:assert/strict';
import * as vscode from 'vscode';
import { hoverText, lineOf, openNote, RESTRICTED, scratchFolder, writeText } from './helpers.js';

/** An invented gauge record: a 11.86-year cycle plus a slow drift, sampled yearly with a gap. */
function gaugeCsv(): string {
  const rows = ['year,flow'];
  for (let y = 1850; y <= 2020; y++) {
    if (y >= 1915 && y < 1922) continue;
    const flow = 10 + 2 * Math.sin((2 * Math.PI * (y - 1850)) / 11.86) + 0.01 * (y - 1850) + 0.3 * Math.cos(y * 7.3);
    rows.push(`${y},${flow.toFixed(3)}`);
  }
  return `${rows.join('\n')}\n`;
}

const NOTE = [
  '# Analysis statements in the editor',
  '',
  '```orbit analysis',
  'series gauge from "gauge.csv" time year value flow time-unit yr',
  'periodogram gauge periods 3 yr to 60 yr peaks 2 mark period(jupiter)',
  'alignment jupiter saturn within 10 deg from 1990 to 2030',
  'barycentre from 1990 to 2030',
  '```',
  '',
].join('\n');

(RESTRICTED ? describe.skip : describe)('Series, periodograms, alignments and the barycentre in the editor', function () {
  this.timeout(90_000);
  const folder = scratchFolder('analysis');

  it('shows their results inline, with plots in the preview and the not-a-forecast caution in the hover', async () => {
    await writeText(vscode.Uri.joinPath(folder, 'gauge.csv'), gaugeCsv());
    const { doc } = await openNote(folder, 'analysis.md', NOTE);
    const html = await vscode.commands.executeCommand<string>('markdown.api.render', doc.getText());
    // One plot each at least: the series, the periodogram, the alignment windows, the barycentre path.
    const svgs = html.match(/<svg[\s>]/g)?.length ?? 0;
    assert.ok(svgs >= 4, `${svgs} plots in the preview`);
    // The 11.86-year cycle put into the invented record is the top peak.
    assert.match(html, /top peak 11\.[7-9]\d* yr/);
    assert.match(html, /not a forecast/);
    const hover = hoverText(await vscode.commands.executeCommand<vscode.Hover[]>('vscode.executeHoverProvider', doc.uri, new vscode.Position(lineOf(doc, 'periodogram gauge'), 3)));
    assert.match(hover, /not a forecast/);
    const alignment = hoverText(await vscode.commands.executeCommand<vscode.Hover[]>('vscode.executeHoverProvider', doc.uri, new vscode.Position(lineOf(doc, 'alignment jupiter'), 3)));
    assert.match(alignment, /window/);
    const diagnostics = vscode.languages.getDiagnostics(doc.uri).filter((d) => d.severity === vscode.DiagnosticSeverity.Error);
    assert.deepEqual(diagnostics.map((d) => `${String(d.code)} ${d.message}`), []);
  });
});
