// Starts `sheaf lsp` for .sheaf files. Everything the editor shows beyond
// highlighting comes from the server; this file only starts and stops it.
const vscode = require("vscode");
const { LanguageClient } = require("vscode-languageclient/node");

let client;

function activate(context) {
  const cfg = vscode.workspace.getConfiguration("sheaf");
  const command = cfg.get("path") || "sheaf";
  const args = ["lsp", "--debounce", cfg.get("debounce") || "200ms"];
  client = new LanguageClient(
    "sheaf",
    "Sheaf",
    { command, args },
    {
      documentSelector: [{ scheme: "file", language: "sheaf" }],
      synchronize: { fileEvents: vscode.workspace.createFileSystemWatcher("**/*.sheaf") },
    }
  );
  context.subscriptions.push({ dispose: () => client && client.stop() });
  return client.start();
}

function deactivate() {
  return client ? client.stop() : undefined;
}

module.exports = { activate, deactivate };
