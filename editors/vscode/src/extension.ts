// The Plenum extension: starts `plenum lsp` for *.plenum files. Everything
// (diagnostics, hover, completion, inlay hints, formatting…) comes from the
// server; the extension only launches it and passes its configuration.

import * as vscode from "vscode";
import {
  LanguageClient,
  LanguageClientOptions,
  ServerOptions,
  TransportKind,
} from "vscode-languageclient/node";

let client: LanguageClient | undefined;

function serverOptions(): ServerOptions {
  const config = vscode.workspace.getConfiguration("plenum");
  const command = config.get<string>("server.path", "plenum");
  const args = config.get<string[]>("server.args", ["lsp"]);
  return {
    run: { command, args, transport: TransportKind.stdio },
    debug: { command, args, transport: TransportKind.stdio },
  };
}

export async function activate(context: vscode.ExtensionContext): Promise<void> {
  const clientOptions: LanguageClientOptions = {
    documentSelector: [{ scheme: "file", language: "plenum" }],
    synchronize: {
      // The server also registers these watchers itself; this covers
      // clients that do not support dynamic registration.
      fileEvents: [
        vscode.workspace.createFileSystemWatcher("**/*.plenum"),
        vscode.workspace.createFileSystemWatcher("**/plenum.toml"),
      ],
    },
  };
  client = new LanguageClient("plenum", "Plenum", serverOptions(), clientOptions);
  context.subscriptions.push(
    vscode.commands.registerCommand("plenum.restartServer", async () => {
      if (client) {
        await client.restart();
      }
    }),
  );
  await client.start();
}

export async function deactivate(): Promise<void> {
  if (client) {
    await client.stop();
    client = undefined;
  }
}
