/**
 * The preload exposes `window.ebbline`, derived from the IPC contract: named methods only,
 * never `ipcRenderer` itself. It is bundled into one file because sandboxed preloads cannot
 * load local modules.
 */
import { contextBridge, ipcRenderer, type IpcRendererEvent } from 'electron';
import { API_METHODS, MENU_CHANNEL, MENU_COMMANDS, type EbblineApi, type MenuCommand } from './ipc-contract';

function invoker<R>(channel: string) {
  return (request?: unknown) => ipcRenderer.invoke(channel, request ?? null) as Promise<R>;
}

// Typed against EbblineApi: a channel added to the contract without a method here fails to compile.
const api: EbblineApi = {
  openStatements: invoker(API_METHODS.openStatements),
  openFile: invoker(API_METHODS.openFile),
  saveFile: invoker(API_METHODS.saveFile),
  saveReportPdf: invoker(API_METHODS.saveReportPdf),
  appInfo: invoker(API_METHODS.appInfo),
  onMenuCommand(listener: (command: MenuCommand) => void) {
    const relay = (_event: IpcRendererEvent, command: unknown) => {
      if (typeof command === 'string' && (MENU_COMMANDS as readonly string[]).includes(command)) {
        listener(command as MenuCommand);
      }
    };
    ipcRenderer.on(MENU_CHANNEL, relay);
    return () => {
      ipcRenderer.removeListener(MENU_CHANNEL, relay);
    };
  },
};

contextBridge.exposeInMainWorld('ebbline', api);
