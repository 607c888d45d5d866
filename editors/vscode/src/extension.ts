// The hmb extension: starts `hmb lsp` for .hmb files and adds commands that show the solved
// stream table of the current file and its heat and material balance diagram (in a panel beside
// it, redrawn on every save). Everything about the notation itself (diagnostics, hover,
// completion, formatting) comes from the language server, so the editor and `hmb check` in CI
// always agree.

import { execFile } from 'node:child_process';
import * as fs from 'node:fs/promises';
import * as os from 'node:os';
import * as path from 'node:path';
import * as vscode from 'vscode';
import { LanguageClient, LanguageClientOptions, ServerOptions } from 'vscode-languageclient/node';

let client: LanguageClient | undefined;
let output: vscode.OutputChannel | undefined;

export async function activate(context: vscode.ExtensionContext): Promise<void> {
  output = vscode.window.createOutputChannel('hmb');
  context.subscriptions.push(output);
  context.subscriptions.push(
    vscode.commands.registerCommand('hmb.showStreamTable', showStreamTable),
    vscode.commands.registerCommand('hmb.showFlowsheet', showFlowsheet),
    vscode.workspace.onDidSaveTextDocument((doc) => {
      if (flowsheet && doc.uri.toString() === flowsheet.uri.toString()) {
        void refreshFlowsheet();
      }
    }),
    vscode.commands.registerCommand('hmb.restartServer', async () => {
      await stopClient();
      await startClient();
    }),
    vscode.workspace.onDidChangeConfiguration(async (e) => {
      if (e.affectsConfiguration('hmb.path')) {
        await stopClient();
        await startClient();
      }
    }),
  );
  await startClient();
}

export async function deactivate(): Promise<void> {
  await stopClient();
}

// hmbPath is the configured executable; a bare name is resolved on PATH by the operating system.
function hmbPath(): string {
  const p = vscode.workspace.getConfiguration('hmb').get<string>('path', 'hmb').trim();
  return p === '' ? 'hmb' : p;
}

async function startClient(): Promise<void> {
  const command = hmbPath();
  const serverOptions: ServerOptions = { command, args: ['lsp'] };
  const clientOptions: LanguageClientOptions = {
    documentSelector: [
      { scheme: 'file', language: 'hmb' },
      { scheme: 'untitled', language: 'hmb' },
    ],
    outputChannel: output,
  };
  client = new LanguageClient('hmb', 'hmb language server', serverOptions, clientOptions);
  try {
    await client.start();
  } catch (err) {
    client = undefined;
    const msg = err instanceof Error ? err.message : String(err);
    void vscode.window.showErrorMessage(
      `hmb: could not start "${command} lsp" (${msg}). Install hmb or set "hmb.path".`,
    );
  }
}

async function stopClient(): Promise<void> {
  const c = client;
  client = undefined;
  if (c) {
    await c.stop();
  }
}

interface RunResult {
  code: number;
  stdout: string;
  stderr: string;
}

function run(command: string, args: string[], cwd: string): Promise<RunResult> {
  return new Promise((resolve, reject) => {
    execFile(command, args, { cwd, maxBuffer: 16 << 20 }, (err, stdout, stderr) => {
      if (err && typeof err.code !== 'number') {
        reject(err); // not started at all: missing executable, permissions
        return;
      }
      resolve({ code: err ? (err.code as number) : 0, stdout, stderr });
    });
  });
}

// showStreamTable runs `hmb table --format md` on the current file and shows the result beside
// it. An hmb without the table command (exit status 2, "unknown command") gets `hmb check`,
// whose text output carries the same table after the diagnostics.
async function showStreamTable(): Promise<void> {
  const editor = vscode.window.activeTextEditor;
  if (!editor || editor.document.languageId !== 'hmb') {
    void vscode.window.showWarningMessage('hmb: open a .hmb calc file first.');
    return;
  }
  const doc = editor.document;
  // Unsaved text is what the user sees, so that is what gets solved: a dirty or untitled buffer
  // goes to a temporary copy.
  let file = doc.uri.fsPath;
  let tmpDir: string | undefined;
  if (doc.isUntitled || doc.isDirty || doc.uri.scheme !== 'file') {
    tmpDir = await fs.mkdtemp(path.join(os.tmpdir(), 'hmb-'));
    file = path.join(tmpDir, doc.isUntitled ? 'untitled.hmb' : path.basename(doc.uri.fsPath));
    await fs.writeFile(file, doc.getText(), 'utf8');
  }
  const cwd = path.dirname(file);
  const command = hmbPath();
  try {
    let res = await run(command, ['table', '--format', 'md', file], cwd);
    let language = 'markdown';
    if (res.code === 2 && /unknown command/.test(res.stderr)) {
      res = await run(command, ['check', file], cwd);
      language = 'plaintext';
    }
    if (res.stdout.trim() === '') {
      void vscode.window.showErrorMessage(`hmb: ${res.stderr.trim() || 'no output'}`);
      return;
    }
    if (res.code !== 0 && res.stderr.trim() !== '') {
      // Errors in the file: the table still shows what could be solved; the problems are in the
      // Problems view through the language server.
      void vscode.window.showWarningMessage(`hmb: ${res.stderr.trim()}`);
    }
    const shown = await vscode.workspace.openTextDocument({ content: res.stdout, language });
    await vscode.window.showTextDocument(shown, { viewColumn: vscode.ViewColumn.Beside, preview: true });
    if (language === 'markdown') {
      await vscode.commands.executeCommand('markdown.showPreview', shown.uri);
    }
  } catch (err) {
    const msg = err instanceof Error ? err.message : String(err);
    void vscode.window.showErrorMessage(`hmb: could not run "${command}" (${msg}). Install hmb or set "hmb.path".`);
  } finally {
    if (tmpDir) {
      await fs.rm(tmpDir, { recursive: true, force: true });
    }
  }
}

// The heat and material balance diagram of one calc file, in a panel beside it.
let flowsheet: { panel: vscode.WebviewPanel; uri: vscode.Uri } | undefined;

// showFlowsheet opens (or points) the diagram panel at the current file. The language server
// draws the diagram (command hmb.flowsheet), so it shows what the server solved: the text in
// the editor, saved or not.
async function showFlowsheet(): Promise<void> {
  const editor = vscode.window.activeTextEditor;
  if (!editor || editor.document.languageId !== 'hmb') {
    void vscode.window.showWarningMessage('hmb: open a .hmb calc file first.');
    return;
  }
  if (!client) {
    void vscode.window.showErrorMessage('hmb: the language server is not running (see "hmb: Restart Language Server").');
    return;
  }
  const uri = editor.document.uri;
  if (flowsheet) {
    flowsheet.uri = uri;
    flowsheet.panel.reveal(vscode.ViewColumn.Beside, true);
  } else {
    const panel = vscode.window.createWebviewPanel(
      'hmb.flowsheet',
      'Heat and material balance diagram',
      { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true },
      { enableScripts: false },
    );
    flowsheet = { panel, uri };
    panel.onDidDispose(() => {
      flowsheet = undefined;
    });
  }
  await refreshFlowsheet();
}

// refreshFlowsheet asks the language server for the diagram of the panel's file and shows it.
async function refreshFlowsheet(): Promise<void> {
  const f = flowsheet;
  const c = client;
  if (!f || !c) {
    return;
  }
  const name = path.basename(f.uri.fsPath || f.uri.path || 'calc file');
  try {
    const svg = await c.sendRequest('workspace/executeCommand', {
      command: 'hmb.flowsheet',
      arguments: [f.uri.toString()],
    });
    f.panel.title = `HMB diagram: ${name}`;
    f.panel.webview.html = flowsheetPage(String(svg));
  } catch (err) {
    const msg = err instanceof Error ? err.message : String(err);
    f.panel.webview.html = flowsheetPage(`<p>hmb could not draw ${escapeHtml(name)}: ${escapeHtml(msg)}</p>`);
  }
}

// flowsheetPage wraps the server's SVG in a page that runs no script and loads nothing.
function flowsheetPage(body: string): string {
  return `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">
<style>body{background:#fff;color:#111;margin:0;padding:8px}svg{display:block;width:100%;height:auto}</style>
</head><body>
${body}
</body></html>`;
}

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (ch) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[ch] ?? ch);
}
