/**
 * The preload of the desktop window: it exposes to the page one method per channel, each
 * bound to its own IPC name, and nothing else (no generic invoke, no Node, no Electron).
 */
import { contextBridge, ipcRenderer } from 'electron';
import { CHANNEL_NAMES, ipcName } from './channel-names.ts';

const bridge: Record<string, (request?: unknown) => Promise<unknown>> = {};
for (const name of CHANNEL_NAMES) {
  const channel = ipcName(name);
  bridge[name] = (request?: unknown) => ipcRenderer.invoke(channel, request ?? {});
}

/** Menu commands from the main process (new home, import, print…), one listener at a time. */
function onMenuCommand(listener: (command: string) => void): void {
  ipcRenderer.removeAllListeners('sealwork:menu');
  ipcRenderer.on('sealwork:menu', (_event, command: unknown) => {
    if (typeof command === 'string') listener(command);
  });
}

/** Asks the main process to save a stored home as a file, with the native save dialog. */
function saveHomeFile(request: { id: number }): Promise<unknown> {
  return ipcRenderer.invoke('sealwork:desktop.saveHomeFile', request);
}

/** Tells the main process the proposal it asked for is drawn (or why it cannot be). */
function proposalShown(answer: { shown: boolean; why: string }): Promise<unknown> {
  return ipcRenderer.invoke('sealwork:desktop.proposalShown', answer);
}

contextBridge.exposeInMainWorld(
  'sealwork',
  Object.freeze({ ...bridge, onMenuCommand, saveHomeFile, proposalShown }),
);
