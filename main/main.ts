/**
 * Ebbline's Electron entry. It only calls the setups; each module owns its part.
 */
import path from 'node:path';
import fs from 'node:fs/promises';
import { pathToFileURL } from 'node:url';
import { app, BrowserWindow, Menu, net, protocol, screen, session, shell } from 'electron';
import { APP_SCHEME_PRIVILEGES, appResponseHeaders, resolveAppPath } from './appProtocol';
import { MENU_CHANNEL, type MenuCommand } from './ipc-contract';
import { setupIpc } from './ipc';
import { buildMenuTemplate } from './menu';
import {
  APP_ENTRY_URL,
  APP_SCHEME,
  isAllowedNavigation,
  isAllowedRequest,
  permissionDecision,
  secureWebPreferences,
} from './security';
import { loadWindowState, placeOnDisplays, saveWindowState } from './windowState';

const rendererRoot = path.join(__dirname, '..', 'renderer');
let mainWindow: BrowserWindow | null = null;

function setupSingleInstance(): boolean {
  if (!app.requestSingleInstanceLock()) {
    app.quit();
    return false;
  }
  app.on('second-instance', () => {
    if (!mainWindow) return;
    if (mainWindow.isMinimized()) mainWindow.restore();
    mainWindow.focus();
  });
  return true;
}

function setupAppProtocol(): void {
  protocol.handle(APP_SCHEME, async (request) => {
    const file = resolveAppPath(rendererRoot, request.url);
    if (!file) return new Response('Not found', { status: 404 });
    try {
      await fs.access(file);
    } catch {
      return new Response('Not found', { status: 404 });
    }
    const response = await net.fetch(pathToFileURL(file).toString());
    return new Response(response.body, { status: 200, headers: appResponseHeaders(file) });
  });
}

function setupSessionHardening(): void {
  const s = session.defaultSession;
  s.setPermissionRequestHandler((_wc, permission, callback) => callback(permissionDecision(permission)));
  s.setPermissionCheckHandler((_wc, permission) => permissionDecision(permission));
  // Offline by design: only the app's own files load; every network request is refused.
  s.webRequest.onBeforeRequest((details, callback) => callback({ cancel: !isAllowedRequest(details.url) }));
  app.on('web-contents-created', (_event, contents) => {
    contents.on('will-navigate', (event, url) => {
      if (!isAllowedNavigation(url)) event.preventDefault();
    });
    contents.on('will-attach-webview', (event) => event.preventDefault());
    contents.setWindowOpenHandler(() => ({ action: 'deny' }));
  });
  // Never hand URLs from content to the operating system.
  void shell;
}

function createWindow(): void {
  const stateFile = path.join(app.getPath('userData'), 'window-state.json');
  const state = placeOnDisplays(
    loadWindowState(stateFile),
    screen.getAllDisplays().map((d) => d.workArea),
  );
  mainWindow = new BrowserWindow({
    ...state,
    minWidth: 900,
    minHeight: 600,
    show: false,
    title: 'Ebbline',
    backgroundColor: '#f6f4ef',
    webPreferences: secureWebPreferences(path.join(__dirname, 'preload.js')),
  });
  if (state.maximized) mainWindow.maximize();
  mainWindow.once('ready-to-show', () => mainWindow?.show());
  mainWindow.on('close', () => {
    if (!mainWindow) return;
    const bounds = mainWindow.getNormalBounds();
    saveWindowState(stateFile, { ...bounds, maximized: mainWindow.isMaximized() });
  });
  mainWindow.on('closed', () => {
    mainWindow = null;
  });
  // `npm start -- --demo`: open the demo workspace on the Outlook.
  void mainWindow.loadURL(process.argv.includes('--demo') ? `${APP_ENTRY_URL}?demo` : APP_ENTRY_URL);
}

function setupMenu(): void {
  const send = (command: MenuCommand) => mainWindow?.webContents.send(MENU_CHANNEL, command);
  Menu.setApplicationMenu(Menu.buildFromTemplate(buildMenuTemplate(send, process.platform === 'darwin')));
}

protocol.registerSchemesAsPrivileged([APP_SCHEME_PRIVILEGES]);
if (setupSingleInstance()) {
  app.on('window-all-closed', () => app.quit());
  void app.whenReady().then(() => {
    setupAppProtocol();
    setupSessionHardening();
    setupIpc(() => mainWindow);
    setupMenu();
    createWindow();
  });
}
