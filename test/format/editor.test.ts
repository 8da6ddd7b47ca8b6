import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { TextDocument } from 'vscode-languageserver-textdocument';
import languageService from 'yaml-language-server/lib/umd/languageservice/yamlLanguageService.js';

/**
 * What an editor shows with the schemas: the YAML language server (the `yaml-language-server`
 * package, run here as a library) reads each demo's `# yaml-language-server: $schema=…`
 * modeline, fetches the committed schema from disk, completes keys, shows descriptions and
 * flags unknown keys.
 */
const service = languageService.getLanguageService({
  schemaRequestService: async (uri: string) => readFileSync(fileURLToPath(uri), 'utf8'),
  workspaceContext: { resolveRelativePath: (relative: string, resource: string) => new URL(relative, resource).href },
});
service.configure({ validate: true, completion: true, hover: true, yamlVersion: '1.2' });

let version = 0;

/** A demo file's text with `edit` applied, as the editor would hold it (a new version each time: the service caches by uri and version). */
function document(demo: string, edit: (text: string) => string): { doc: TextDocument; lines: string[] } {
  const path = resolve(demo);
  const text = edit(readFileSync(path, 'utf8'));
  return { doc: TextDocument.create(pathToFileURL(path).href, 'yaml', ++version, text), lines: text.split('\n') };
}

describe('the schemas in the YAML language server', () => {
  it('complete the keys of a step: built-in gates, actions and modifiers', async () => {
    const { doc, lines } = document('circuits/ramsey-echo.yaml', (t) => t.replace(/^steps:\n/m, 'steps:\n  - rz: 0\n    \n'));
    const line = lines.indexOf('    ');
    const labels = (await service.doComplete(doc, { line, character: 4 }, false)).items.map((i) => i.label);
    expect(labels).toEqual(expect.arrayContaining(['h', 'cx', 'ccx', 'idle', 'measure', 'reset', 'angle', 'noise', 'label']));
    expect(labels).not.toContain('rz'); // already in the step
  });

  it('flag a misspelled key of a circuit and of a device file where it stands', async () => {
    const c = document('circuits/ramsey-echo.yaml', (t) => t.replace(/^steps:\n/m, 'stpes: 3\nsteps:\n'));
    const diagnostics = await service.doValidation(c.doc, false);
    expect(diagnostics.map((d) => [d.range.start.line, d.range.start.character])).toEqual([[c.lines.indexOf('stpes: 3'), 0]]);
    const d = document('circuits/devices/bench-line5.yaml', (t) => t.replace(/^qubits:\n/m, 'qubits:\n  2: { t1: 3us, t3: 1us }\n'));
    const deviceDiagnostics = await service.doValidation(d.doc, false);
    expect(deviceDiagnostics.map((x) => [x.range.start.line, x.range.start.character])).toEqual([[d.lines.indexOf('  2: { t1: 3us, t3: 1us }'), 16]]);
  });

  it('accept every demo as written, and show a key’s description on hover', async () => {
    for (const demo of ['circuits/ghz5.yaml', 'circuits/qpe3-asap.yaml', 'circuits/coupler-swap.yaml', 'circuits/devices/quad-square.yaml', 'circuits/channels/tomography-fit.yaml']) {
      const { doc } = document(demo, (t) => t);
      expect(await service.doValidation(doc, false), demo).toEqual([]);
    }
    const { doc, lines } = document('circuits/ghz5.yaml', (t) => t);
    const hover = await service.doHover(doc, { line: lines.findIndex((l) => l.startsWith('qubits:')), character: 1 });
    expect(JSON.stringify(hover?.contents)).toContain('a count n (qubits 0..n−1, at most 24) or a list of unique labels');
  });
});
