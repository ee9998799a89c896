// Starts `parax lsp` for .parax files. The executable is found, in order, from
// the `parax.path` setting, a binary bundled in the extension's `bin/` folder,
// or `parax` on PATH.
import * as fs from "fs";
import * as path from "path";
import * as vscode from "vscode";
import { LanguageClient, LanguageClientOptions, ServerOptions } from "vscode-languageclient/node";

let client: LanguageClient | undefined;

export function findParax(context: vscode.ExtensionContext): string {
  const configured = vscode.workspace.getConfiguration("parax").get<string>("path", "").trim();
  if (configured !== "") {
    return configured;
  }
  const exe = process.platform === "win32" ? "parax.exe" : "parax";
  const bundled = path.join(context.extensionPath, "bin", exe);
  if (fs.existsSync(bundled)) {
    return bundled;
  }
  return "parax";
}

export async function activate(context: vscode.ExtensionContext): Promise<void> {
  const command = findParax(context);
  const serverOptions: ServerOptions = {
    run: { command, args: ["lsp"] },
    debug: { command, args: ["lsp"] },
  };
  const clientOptions: LanguageClientOptions = {
    documentSelector: [{ scheme: "file", language: "parax" }, { scheme: "untitled", language: "parax" }],
  };
  client = new LanguageClient("parax", "parax", serverOptions, clientOptions);
  try {
    await client.start();
  } catch (e) {
    vscode.window.showErrorMessage(
      `parax: could not start "${command} lsp" (${e}). Install parax or set "parax.path".`
    );
  }
  context.subscriptions.push(
    vscode.workspace.onDidChangeConfiguration(async (ev) => {
      if (ev.affectsConfiguration("parax.path")) {
        await client?.stop();
        await activate(context);
      }
    })
  );
}

export async function deactivate(): Promise<void> {
  await client?.stop();
}
