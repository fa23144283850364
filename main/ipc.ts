/**
 * Answers the renderer's IPC calls. Every message is checked twice before anything runs:
 * its sender must be the app's own top frame of the one window, and its payload must pass
 * the contract's validator.
 */
import { app, ipcMain, type BrowserWindow, type IpcMainInvokeEvent } from 'electron';
import { REQUEST_VALIDATORS, type IpcChannel, type IpcContract } from './ipc-contract';
import { isTrustedSender } from './security';
import { openOneFile, openStatementFiles, saveContent, saveWindowAsPdf } from './dialogs';

type Handler<C extends IpcChannel> = (
  request: IpcContract[C]['request'],
  window: BrowserWindow,
) => Promise<IpcContract[C]['response']>;

const HANDLERS: { [C in IpcChannel]: Handler<C> } = {
  'statements:open': (_r, w) => openStatementFiles(w),
  'file:open': (r, w) => openOneFile(w, r),
  'file:save': (r, w) => saveContent(w, r),
  'report:pdf': (r, w) => saveWindowAsPdf(w, r.suggestedName),
  'app:info': async () => ({
    version: app.getVersion(),
    platform: process.platform,
    electron: process.versions.electron ?? '',
  }),
};

function register<C extends IpcChannel>(channel: C, getWindow: () => BrowserWindow | null): void {
  ipcMain.handle(channel, async (event: IpcMainInvokeEvent, payload: unknown) => {
    const window = getWindow();
    const frame = event.senderFrame;
    if (
      !window ||
      event.sender !== window.webContents ||
      !isTrustedSender(frame?.url, frame === event.sender.mainFrame)
    ) {
      throw new Error(`${channel}: refused a message from an untrusted sender`);
    }
    const request = REQUEST_VALIDATORS[channel](payload);
    return HANDLERS[channel](request, window);
  });
}

export function setupIpc(getWindow: () => BrowserWindow | null): void {
  for (const channel of Object.keys(HANDLERS) as IpcChannel[]) register(channel, getWindow);
}
