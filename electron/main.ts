/**
 * The desktop host: one hardened window showing the built renderer from the app's own scheme,
 * with every host call routed over IPC to the same handlers and checks as browser mode.
 * Usage: zvet-desktop [WORKLIST_FOLDER]
 */
import { app, BrowserWindow, ipcMain, protocol, session } from 'electron';
import { readFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { HOST_METHODS } from '../core/api/host-api.js';
import { describeFailure } from '../core/node/cli/run-action.js';
import { createHostHandlers } from '../core/node/host/handlers.js';
import { SECURITY_HEADERS } from '../core/node/host/security-headers.js';
import { resolveStaticFile } from '../core/node/host/static-files.js';
import { hardenWebContents } from './harden.js';
import { channelFor } from './ipc-channels.js';
import { routeIpcCall } from './ipc-route.js';
import { APP_SCHEME, APP_START_URL, buildWindowOptions, isAllowedRequest } from './window-options.js';

// This file is bundled to dist/electron/main.cjs; the window's files are in dist/renderer/.
const rendererRoot = resolve(__dirname, '..', 'renderer');

protocol.registerSchemesAsPrivileged([{ scheme: APP_SCHEME, privileges: { standard: true, secure: true, supportFetchAPI: true } }]);

function worklistArgument(): string | null {
  const args = process.argv.slice(app.isPackaged ? 1 : 2).filter((a) => !a.startsWith('-'));
  return args.length > 0 ? resolve(args[0]) : null;
}

async function serveAppFile(request: Request): Promise<Response> {
  const url = new URL(request.url);
  const found = url.host === 'app' ? await resolveStaticFile(rendererRoot, url.pathname) : ({ ok: false, status: 404, reason: 'not an app file' } as const);
  if (!found.ok) return new Response(found.reason, { status: found.status, headers: { ...SECURITY_HEADERS } });
  return new Response(await readFile(found.file), { headers: { ...SECURITY_HEADERS, 'Content-Type': found.contentType } });
}

app.on('web-contents-created', (_event, contents) => hardenWebContents(contents));

app.whenReady().then(async () => {
  const handlers = createHostHandlers();
  const folder = worklistArgument();
  if (folder) {
    await handlers.openWorklist({ path: folder }).catch((err: unknown) => {
      process.stderr.write(`zvet: ${describeFailure(err)}\n`);
    });
  }

  const ses = session.defaultSession;
  ses.setPermissionRequestHandler((_contents, _permission, callback) => callback(false));
  ses.setPermissionCheckHandler(() => false);
  ses.webRequest.onBeforeRequest((details, callback) => callback({ cancel: !isAllowedRequest(details.url) }));
  protocol.handle(APP_SCHEME, serveAppFile);

  for (const method of HOST_METHODS) {
    ipcMain.handle(channelFor(method), (event, request: unknown) => routeIpcCall(handlers, method, event.senderFrame?.url, request));
  }

  const window = new BrowserWindow(buildWindowOptions({ preloadPath: join(__dirname, 'preload.cjs'), iconPath: join(__dirname, 'icon.png') }));
  window.once('ready-to-show', () => window.show());
  await window.loadURL(APP_START_URL);

  app.on('window-all-closed', () => {
    handlers.close().finally(() => app.quit());
  });
});
