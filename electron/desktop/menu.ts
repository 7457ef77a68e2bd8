/**
 * The native menu, as a plain template so it can be read and tested without Electron. Menu
 * commands go to the page, which runs them through its own bridge.
 */
export type MenuCommand =
  | 'newHome'
  | 'importFile'
  | 'exportHome'
  | 'backup'
  | 'restore'
  | 'printProposal'
  | 'shortcuts'
  | 'about';

export interface MenuItemTemplate {
  label?: string;
  role?: string;
  accelerator?: string;
  type?: 'separator';
  command?: MenuCommand;
  submenu?: MenuItemTemplate[];
}

/** The menu bar: File, Edit, View, Help. */
export function menuTemplate(options: { isMac: boolean; devTools: boolean }): MenuItemTemplate[] {
  const file: MenuItemTemplate = {
    label: 'File',
    submenu: [
      { label: 'New home', accelerator: 'CmdOrCtrl+N', command: 'newHome' },
      { label: 'Import home file or CSV…', accelerator: 'CmdOrCtrl+O', command: 'importFile' },
      { label: 'Export home file…', accelerator: 'CmdOrCtrl+E', command: 'exportHome' },
      { type: 'separator' },
      { label: 'Back up project…', command: 'backup' },
      { label: 'Restore from backup…', command: 'restore' },
      { type: 'separator' },
      { label: 'Print proposal to PDF…', accelerator: 'CmdOrCtrl+P', command: 'printProposal' },
      { type: 'separator' },
      { role: options.isMac ? 'close' : 'quit' },
    ],
  };
  const edit: MenuItemTemplate = {
    label: 'Edit',
    submenu: [
      { role: 'undo' },
      { role: 'redo' },
      { type: 'separator' },
      { role: 'cut' },
      { role: 'copy' },
      { role: 'paste' },
      { role: 'selectAll' },
    ],
  };
  const view: MenuItemTemplate = {
    label: 'View',
    submenu: [
      { role: 'resetZoom' },
      { role: 'zoomIn' },
      { role: 'zoomOut' },
      { type: 'separator' },
      { role: 'togglefullscreen' },
      ...(options.devTools ? [{ role: 'toggleDevTools' }] : []),
    ],
  };
  const help: MenuItemTemplate = {
    label: 'Help',
    submenu: [
      { label: 'Keyboard shortcuts', accelerator: 'F1', command: 'shortcuts' },
      { label: 'About Sealwork', command: 'about' },
    ],
  };
  return options.isMac ? [{ role: 'appMenu' }, file, edit, view, help] : [file, edit, view, help];
}
