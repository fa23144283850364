/**
 * The application menu. Every item that acts on the workspace sends a `MenuCommand` to the
 * renderer, which owns the behaviour; main only relays.
 */
import type { MenuItemConstructorOptions } from 'electron';
import type { MenuCommand } from './ipc-contract';

/**
 * Builds the menu template.
 * @param send relays a command to the renderer.
 * @param isMac adds the application menu macOS expects.
 */
export function buildMenuTemplate(send: (command: MenuCommand) => void, isMac: boolean): MenuItemConstructorOptions[] {
  const item = (label: string, command: MenuCommand, accelerator?: string): MenuItemConstructorOptions => ({
    label,
    click: () => send(command),
    ...(accelerator ? { accelerator } : {}),
  });
  const template: MenuItemConstructorOptions[] = [];
  if (isMac) template.push({ role: 'appMenu' });
  template.push(
    {
      label: '&File',
      submenu: [
        item('Import statements…', 'import-statements', 'CmdOrCtrl+O'),
        item('New workspace…', 'new-workspace', 'CmdOrCtrl+N'),
        { type: 'separator' },
        item('Export backup…', 'export-backup', 'CmdOrCtrl+Shift+E'),
        item('Restore backup…', 'restore-backup'),
        { type: 'separator' },
        item('Print or save report as PDF…', 'print-report', 'CmdOrCtrl+P'),
        { type: 'separator' },
        isMac ? { role: 'close' } : { role: 'quit' },
      ],
    },
    {
      label: '&Edit',
      submenu: [
        { role: 'undo' },
        { role: 'redo' },
        { type: 'separator' },
        { role: 'cut' },
        { role: 'copy' },
        { role: 'paste' },
        { role: 'selectAll' },
      ],
    },
    {
      label: '&View',
      submenu: [
        item('Accounts and statements', 'show-accounts', 'CmdOrCtrl+1'),
        item('Transactions', 'show-transactions', 'CmdOrCtrl+2'),
        item('Recurring flows', 'show-recurring', 'CmdOrCtrl+3'),
        item('Outlook', 'show-forecast', 'CmdOrCtrl+4'),
        item('Patterns', 'show-patterns', 'CmdOrCtrl+5'),
        item('Scenarios', 'show-scenarios', 'CmdOrCtrl+6'),
        item('Report', 'show-report', 'CmdOrCtrl+7'),
        { type: 'separator' },
        { role: 'resetZoom' },
        { role: 'zoomIn' },
        { role: 'zoomOut' },
        { type: 'separator' },
        { role: 'togglefullscreen' },
        { role: 'toggleDevTools' },
      ],
    },
    { role: 'windowMenu' },
  );
  return template;
}
