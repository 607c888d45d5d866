// Tests of the compiled extension (out/extension.js) with stand-ins for the vscode API and the
// language client, and a real hmb for the stream table. usage: HMB=/path/to/hmb npm run test:unit
'use strict';
const assert = require('node:assert/strict');
const fs = require('node:fs');
const Module = require('node:module');
const os = require('node:os');
const path = require('node:path');
const test = require('node:test');

const hmb = process.env.HMB || 'hmb';
const sample = path.join(__dirname, 'table.hmb');

// fakeVscode records what the extension asks of the editor.
function fakeVscode(settings) {
  const rec = { commands: {}, opened: [], shown: [], executed: [], errors: [], warnings: [], clients: [],
    panels: [], requests: [], onSave: [] };
  rec.vscode = {
    window: {
      activeTextEditor: undefined,
      createOutputChannel: () => ({ dispose() {} }),
      showErrorMessage: (m) => rec.errors.push(m),
      showWarningMessage: (m) => rec.warnings.push(m),
      showTextDocument: async (doc, opts) => rec.shown.push({ doc, opts }),
      createWebviewPanel: (viewType, title, show, options) => {
        const panel = { viewType, title, show, options, webview: { html: '' }, revealed: 0, disposers: [],
          reveal() { this.revealed++; },
          onDidDispose(fn) { this.disposers.push(fn); return { dispose() {} }; },
          dispose() { this.disposers.forEach((fn) => fn()); } };
        rec.panels.push(panel);
        return panel;
      },
    },
    workspace: {
      getConfiguration: () => ({ get: (key, dflt) => (key in settings ? settings[key] : dflt) }),
      onDidChangeConfiguration: () => ({ dispose() {} }),
      onDidSaveTextDocument: (fn) => {
        rec.onSave.push(fn);
        return { dispose() {} };
      },
      openTextDocument: async (init) => {
        const doc = { ...init, uri: { toString: () => 'untitled:' + rec.opened.length } };
        rec.opened.push(doc);
        return doc;
      },
    },
    commands: {
      registerCommand: (name, fn) => {
        rec.commands[name] = fn;
        return { dispose() {} };
      },
      executeCommand: async (...args) => rec.executed.push(args),
    },
    ViewColumn: { Beside: -2 },
  };
  rec.client = {
    LanguageClient: class {
      constructor(id, name, server, client) {
        Object.assign(this, { id, name, server, client });
        rec.clients.push(this);
      }
      async start() {}
      async stop() {}
      // The language server's hmb.flowsheet, stood in for by the same drawing from a real hmb:
      // hmb plot --kind flowsheet --values on the file the URI names.
      async sendRequest(method, params) {
        rec.requests.push({ method, params });
        const file = new URL(params.arguments[0]).pathname;
        return require('node:child_process').execFileSync(hmb, ['plot', '--kind', 'flowsheet', '--values', file]).toString();
      }
    },
  };
  return rec;
}

// load loads a fresh copy of the extension against the stand-ins.
function load(rec) {
  const orig = Module._load;
  Module._load = function (request, ...rest) {
    if (request === 'vscode') return rec.vscode;
    if (request === 'vscode-languageclient/node') return rec.client;
    return orig.call(this, request, ...rest);
  };
  try {
    const file = require.resolve('../out/extension.js');
    delete require.cache[file];
    return require(file);
  } finally {
    Module._load = orig;
  }
}

function editorOn(file, text) {
  return {
    document: {
      languageId: 'hmb',
      uri: { fsPath: file, scheme: 'file', path: file, toString: () => 'file://' + file },
      isUntitled: false,
      isDirty: text !== undefined,
      getText: () => text ?? fs.readFileSync(file, 'utf8'),
    },
  };
}

test('starts "hmb lsp" from PATH by default', async () => {
  const rec = fakeVscode({});
  await load(rec).activate({ subscriptions: [] });
  assert.equal(rec.clients.length, 1);
  assert.deepEqual(rec.clients[0].server, { command: 'hmb', args: ['lsp'] });
  assert.deepEqual(rec.clients[0].client.documentSelector.map((s) => s.language), ['hmb', 'hmb']);
  assert.ok(rec.commands['hmb.showStreamTable']);
  assert.ok(rec.commands['hmb.restartServer']);
});

test('hmb.path setting chooses the executable', async () => {
  const rec = fakeVscode({ path: '/opt/hmb/bin/hmb' });
  await load(rec).activate({ subscriptions: [] });
  assert.equal(rec.clients[0].server.command, '/opt/hmb/bin/hmb');
});

test('stream table: hmb table --format md, shown as markdown', async () => {
  const rec = fakeVscode({ path: hmb });
  await load(rec).activate({ subscriptions: [] });
  rec.vscode.window.activeTextEditor = editorOn(sample);
  await rec.commands['hmb.showStreamTable']();
  assert.deepEqual(rec.errors, []);
  assert.equal(rec.opened.length, 1);
  assert.equal(rec.opened[0].language, 'markdown');
  // table.hmb gives stream S1 at 10 bar: 1000 kPa (1 bar = 100 kPa by definition).
  assert.match(rec.opened[0].content, /\|\s*S1\s*\|/);
  assert.match(rec.opened[0].content, /\|\s*1000(\.0*)?\s*\|/);
  assert.equal(rec.executed[0][0], 'markdown.showPreview');
});

test('stream table of unsaved text solves the buffer, not the file on disk', async () => {
  const rec = fakeVscode({ path: hmb });
  await load(rec).activate({ subscriptions: [] });
  const text = fs.readFileSync(sample, 'utf8').replace('stream S1', 'stream Q7').replace('in S1', 'in Q7');
  rec.vscode.window.activeTextEditor = editorOn(sample, text);
  await rec.commands['hmb.showStreamTable']();
  assert.match(rec.opened[0].content, /\|\s*Q7\s*\|/);
});

test('stream table falls back to hmb check when hmb has no table command', async () => {
  // A stand-in hmb that knows only check, answering like an older hmb.
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'hmb-old-'));
  const old = path.join(dir, 'hmb');
  fs.writeFileSync(old, '#!/bin/sh\nif [ "$1" = check ]; then echo "report of $2"; exit 0; fi\n' +
    'echo "hmb: unknown command \\"$1\\"" >&2; exit 2\n', { mode: 0o755 });
  const rec = fakeVscode({ path: old });
  await load(rec).activate({ subscriptions: [] });
  rec.vscode.window.activeTextEditor = editorOn(sample);
  await rec.commands['hmb.showStreamTable']();
  fs.rmSync(dir, { recursive: true });
  assert.equal(rec.opened.length, 1);
  assert.equal(rec.opened[0].language, 'plaintext');
  assert.equal(rec.opened[0].content, `report of ${sample}\n`);
});

test('a missing hmb is reported, not thrown', async () => {
  const rec = fakeVscode({ path: '/nonexistent/hmb' });
  await load(rec).activate({ subscriptions: [] });
  rec.vscode.window.activeTextEditor = editorOn(sample);
  await rec.commands['hmb.showStreamTable']();
  assert.equal(rec.opened.length, 0);
  assert.match(rec.errors.join('\n'), /could not run "\/nonexistent\/hmb"/);
});

test('flowsheet: drawn by the language server in a panel beside the file, redrawn on save', async () => {
  const rec = fakeVscode({ path: hmb });
  await load(rec).activate({ subscriptions: [] });
  assert.ok(rec.commands['hmb.showFlowsheet']);
  const editor = editorOn(sample);
  rec.vscode.window.activeTextEditor = editor;
  await rec.commands['hmb.showFlowsheet']();
  assert.deepEqual(rec.errors, []);
  assert.equal(rec.panels.length, 1);
  const panel = rec.panels[0];
  assert.equal(panel.show.viewColumn, -2); // beside
  assert.equal(panel.options.enableScripts, false);
  assert.deepEqual(rec.requests[0], { method: 'workspace/executeCommand',
    params: { command: 'hmb.flowsheet', arguments: ['file://' + sample] } });
  // table.hmb: the valve V1 between S1 (1 kg/s, 10 bar = 1000 kPa, 250 C) and S2.
  assert.match(panel.webview.html, /Content-Security-Policy/);
  assert.match(panel.webview.html, /<svg [^>]*class="flowsheet"/);
  assert.match(panel.webview.html, /data-unit="V1" data-kind="valve"/);
  assert.match(panel.webview.html, />S1</);
  assert.match(panel.webview.html, />1000\.0 kPa</);
  assert.equal(panel.title, 'HMB diagram: table.hmb');

  // Saving the file redraws; saving another file does not.
  await Promise.all(rec.onSave.map((fn) => fn(editor.document)));
  await new Promise((r) => setImmediate(r));
  assert.equal(rec.requests.length, 2);
  await Promise.all(rec.onSave.map((fn) => fn(editorOn('/elsewhere/other.hmb').document)));
  await new Promise((r) => setImmediate(r));
  assert.equal(rec.requests.length, 2);

  // The command again points the same panel; closing it stops the redraws.
  await rec.commands['hmb.showFlowsheet']();
  assert.equal(rec.panels.length, 1);
  assert.equal(panel.revealed, 1);
  panel.dispose();
  await Promise.all(rec.onSave.map((fn) => fn(editor.document)));
  assert.equal(rec.requests.length, 3);
});

test('flowsheet outside a calc file only warns', async () => {
  const rec = fakeVscode({ path: hmb });
  await load(rec).activate({ subscriptions: [] });
  await rec.commands['hmb.showFlowsheet']();
  assert.equal(rec.panels.length, 0);
  assert.match(rec.warnings.join('\n'), /open a \.hmb calc file/);
});
