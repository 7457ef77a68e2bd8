/**
 * The Electron main process: one locked-down window on the built screens, the channel table
 * behind one checkpoint, the native menu and dialogs, print to PDF, the window's size
 * remembered, one instance at a time. Security rules live in security.ts as plain functions.
 */
import {
  app,
  BrowserWindow,
  dialog,
  ipcMain,
  Menu,
  net,
  protocol,
  screen,
  session,
  shell,
} from 'electron';
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, join, normalize, sep } from 'node:path';
import { pathToFileURL } from 'node:url';
import { parseArgs } from 'node:util';
import { homeFileText } from '../core/weather/home-file-text.ts';
import { backupTo, checkBackup, restoreFrom } from '../db/backup.ts';
import { defaultProjectPath, openProject } from '../db/project.ts';
import type { Store } from '../db/store.ts';
import { CHANNEL_NAMES, ipcName } from './channel-names.ts';
import { callChannel, replyForError, type ChannelName } from './channels.ts';
import { menuTemplate, type MenuItemTemplate } from './desktop/menu.ts';
import { electronAddonPath, ensureElectronAddon } from './desktop/native-addon.ts';
import { loadWindowBounds, saveWindowBounds } from './desktop/window-state.ts';
import {
  CONTENT_SECURITY_POLICY,
  isTrustedSender,
  mayNavigate,
  mayOpenExternally,
  windowOpenDecision,
} from './security.ts';

/** The app's folder: the package when installed, else the repository (main runs from dist/electron). */
const PROJECT_ROOT = app.isPackaged
  ? app.getAppPath()
  : join(dirname(process.argv[1] ?? '.'), '..', '..');
const UI_ROOT = join(PROJECT_ROOT, 'ui', 'dist');

protocol.registerSchemesAsPrivileged([
  { scheme: 'app', privileges: { standard: true, secure: true, supportFetchAPI: true } },
]);

/** Serves the built screens on app://sealwork/, never a file outside them, always with the CSP. */
function serveApp(): void {
  protocol.handle('app', async (request) => {
    const url = new URL(request.url);
    if (url.host !== 'sealwork') return new Response('Not Found', { status: 404 });
    let wanted: string;
    try {
      wanted = url.pathname === '/' ? 'index.html' : decodeURIComponent(url.pathname);
    } catch {
      return new Response('Not Found', { status: 404 }); // a malformed escape names no file
    }
    const file = normalize(join(UI_ROOT, wanted));
    if (!file.startsWith(UI_ROOT + sep)) return new Response('Not Found', { status: 404 });
    const response = await net.fetch(pathToFileURL(file).toString());
    const headers = new Headers(response.headers);
    headers.set('Content-Security-Policy', CONTENT_SECURITY_POLICY);
    headers.set('X-Content-Type-Options', 'nosniff');
    return new Response(response.body, { status: response.status, headers });
  });
}

const REFUSED = {
  ok: false,
  error: { kind: 'forbidden', message: 'refused: not the Sealwork window' },
};

/**
 * The one checkpoint every IPC handler passes: the sender must be the app's own page in the
 * main frame (its URL parsed, not compared as text); anything else is refused before work.
 */
function guarded(
  handler: (event: Electron.IpcMainInvokeEvent, request: unknown) => unknown,
): (event: Electron.IpcMainInvokeEvent, request: unknown) => unknown {
  return (event, request) => {
    const frame = event.senderFrame;
    const trusted =
      frame !== null &&
      isTrustedSender({ url: frame.url, isMainFrame: frame === event.sender.mainFrame });
    return trusted ? handler(event, request) : REFUSED;
  };
}

/** Every channel of the table, each behind the checkpoint. */
function exposeChannels(store: Store): void {
  for (const name of CHANNEL_NAMES) {
    ipcMain.handle(
      ipcName(name),
      guarded((_event, request) => {
        try {
          return callChannel({ store }, name as ChannelName, request);
        } catch (error) {
          return replyForError(error);
        }
      }),
    );
  }
}

function buildMenu(window: BrowserWindow, store: Store): Menu {
  const send = (command: string) => window.webContents.send('sealwork:menu', command);
  const convert = (items: MenuItemTemplate[]): Electron.MenuItemConstructorOptions[] =>
    items.map((item) => {
      if (item.type === 'separator') return { type: 'separator' };
      if (item.submenu)
        return { label: item.label, role: item.role as never, submenu: convert(item.submenu) };
      if (item.role) return { role: item.role as never };
      const command = item.command;
      return {
        label: item.label,
        accelerator: item.accelerator,
        click: () => {
          if (command === 'backup') void backupWithDialog(window, store);
          else if (command === 'restore') void restoreWithDialog(window, store);
          else if (command === 'importFile') void importWithDialog(window, store);
          else if (command === 'printProposal') void printProposal(window);
          else if (command) send(command);
        },
      };
    });
  return Menu.buildFromTemplate(
    convert(menuTemplate({ isMac: process.platform === 'darwin', devTools: !app.isPackaged })),
  );
}

async function backupWithDialog(window: BrowserWindow, store: Store): Promise<void> {
  const choice = await dialog.showSaveDialog(window, {
    title: 'Back up project',
    defaultPath: `sealwork-backup-${new Date().toISOString().slice(0, 10)}.db`,
    filters: [{ name: 'Sealwork project', extensions: ['db'] }],
  });
  if (choice.canceled || !choice.filePath) return;
  try {
    backupTo(store, choice.filePath);
  } catch (error) {
    dialog.showErrorBox('The backup was not written', (error as Error).message);
  }
}

/** Where the open project lives and the addon it was opened with, for a restore. */
let openedProject: { path: string; nativeBinding: string } | null = null;

/**
 * Replaces the project with a backup the user picks, after checking it and asking: the
 * project as it is now is kept beside it (`.before-restore`), then Sealwork starts again on
 * the restored file.
 */
async function restoreWithDialog(window: BrowserWindow, store: Store): Promise<void> {
  if (openedProject === null) return;
  const choice = await dialog.showOpenDialog(window, {
    title: 'Restore the project from a backup',
    properties: ['openFile'],
    filters: [{ name: 'Sealwork project', extensions: ['db'] }],
  });
  const backupPath = choice.filePaths[0];
  if (choice.canceled || !backupPath) return;
  const native = { nativeBinding: openedProject.nativeBinding };
  try {
    checkBackup(backupPath, native);
  } catch (error) {
    dialog.showErrorBox('This backup cannot be restored', (error as Error).message);
    return;
  }
  const answer = await dialog.showMessageBox(window, {
    type: 'warning',
    buttons: ['Restore and start again', 'Keep the project as it is'],
    defaultId: 1,
    cancelId: 1,
    title: 'Restore from a backup',
    message: 'Replace the project with this backup?',
    detail:
      'Everything changed since the backup was made is replaced. The project as it is now is kept beside it, named “.before-restore”, until the next restore.',
  });
  if (answer.response !== 0) return;
  store.close();
  try {
    restoreFrom(backupPath, openedProject.path, native);
  } catch (error) {
    dialog.showErrorBox('The backup was not restored', (error as Error).message);
  }
  app.relaunch();
  app.exit(0);
}

/** Imports a home file or a portfolio CSV the user picks, then tells the page to refresh. */
async function importWithDialog(window: BrowserWindow, store: Store): Promise<void> {
  const choice = await dialog.showOpenDialog(window, {
    title: 'Import a home file or a portfolio CSV',
    properties: ['openFile'],
    filters: [{ name: 'Home file or portfolio CSV', extensions: ['json', 'csv'] }],
  });
  const path = choice.filePaths[0];
  if (choice.canceled || !path) return;
  const text = readFileSync(path, 'utf8');
  const context = { store };
  let failure: string | null = null;
  if (path.toLowerCase().endsWith('.csv')) {
    const reply = callChannel(context, 'portfolio.importCsv', { csv: text });
    if (!reply.ok) failure = reply.error.message;
    else if (reply.value.problems.length > 0) {
      failure = reply.value.problems
        .slice(0, 20)
        .map((problem) => `line ${problem.line}, ${problem.column}: ${problem.message}`)
        .join('\n');
    }
  } else {
    let file: unknown;
    try {
      file = JSON.parse(text) as unknown;
    } catch {
      failure = 'The file is not a Sealwork home file (not JSON).';
    }
    if (failure === null) {
      const reply = callChannel(context, 'homeFile.import', { file });
      if (!reply.ok) failure = reply.error.message;
    }
  }
  if (failure !== null) {
    dialog.showErrorBox('Nothing was imported', failure);
    return;
  }
  window.webContents.send('sealwork:menu', 'refresh');
}

/** Writes a stored home as a home file where the user chooses (asked for by the page). */
function exposeHomeFileSaving(store: Store): void {
  ipcMain.handle(
    'sealwork:desktop.saveHomeFile',
    guarded(async (event, request) => {
      const window = BrowserWindow.fromWebContents(event.sender);
      if (!window) return REFUSED;
      const exported = callChannel({ store }, 'homeFile.export', request);
      if (!exported.ok) return exported;
      const choice = await dialog.showSaveDialog(window, {
        title: 'Export home file',
        defaultPath: `${exported.value.name.replace(/[^\w -]+/g, '').slice(0, 60) || 'home'}.json`,
        filters: [{ name: 'Sealwork home file', extensions: ['json'] }],
      });
      if (choice.canceled || !choice.filePath) return { ok: true, value: { saved: false } };
      writeFileSync(choice.filePath, homeFileText(exported.value), 'utf8');
      return { ok: true, value: { saved: true } };
    }),
  );
}

/** The page's answer to "show the proposal": shown, or why not (no home open, no plan). */
interface ProposalShown {
  shown: boolean;
  why: string;
}

/** Where the page's next answer goes; one print is asked for at a time. */
let awaitingProposal: ((answer: ProposalShown) => void) | null = null;

/** How long the page may take to open a home's proposal and draw it. */
const PROPOSAL_WAIT_MS = 15_000;

function proposalAnswerOf(request: unknown): ProposalShown {
  const answer = request as { shown?: unknown; why?: unknown } | null;
  return {
    shown: answer?.shown === true,
    why: typeof answer?.why === 'string' ? answer.why.slice(0, 500) : '',
  };
}

/** Receives the page's answer once the proposal is drawn (or cannot be). */
function exposeProposalAnswers(): void {
  ipcMain.handle(
    'sealwork:desktop.proposalShown',
    guarded((_event, request) => {
      awaitingProposal?.(proposalAnswerOf(request));
      awaitingProposal = null;
      return { ok: true, value: null };
    }),
  );
}

/** Asks the page to show the open home's proposal and waits until it says it is drawn. */
function showProposal(window: BrowserWindow): Promise<ProposalShown> {
  return new Promise((resolve) => {
    const timer = setTimeout(() => {
      awaitingProposal = null;
      resolve({ shown: false, why: 'The proposal did not appear in time. Open it and try again.' });
    }, PROPOSAL_WAIT_MS);
    awaitingProposal = (answer) => {
      clearTimeout(timer);
      resolve(answer);
    };
    window.webContents.send('sealwork:menu', 'showProposal');
  });
}

/** Prints the open home's proposal to a PDF the user places, with the page's print styles. */
async function printProposal(window: BrowserWindow): Promise<void> {
  const shown = await showProposal(window);
  if (!shown.shown) {
    await dialog.showMessageBox(window, {
      type: 'info',
      title: 'No proposal to print',
      message: 'There is no proposal to print yet.',
      detail: shown.why,
    });
    return;
  }
  const choice = await dialog.showSaveDialog(window, {
    title: 'Save proposal as PDF',
    defaultPath: 'proposal.pdf',
    filters: [{ name: 'PDF', extensions: ['pdf'] }],
  });
  if (choice.canceled || !choice.filePath) return;
  try {
    const pdf = await window.webContents.printToPDF({
      printBackground: true,
      pageSize: 'Letter',
      preferCSSPageSize: true,
    });
    writeFileSync(choice.filePath, pdf);
  } catch (error) {
    dialog.showErrorBox('The proposal was not saved', (error as Error).message);
  }
}

function createWindow(store: Store): BrowserWindow {
  const statePath = join(app.getPath('userData'), 'window-state.json');
  const bounds = onScreen(loadWindowBounds(statePath));
  const window = new BrowserWindow({
    ...bounds,
    minWidth: 1024,
    minHeight: 700,
    show: false,
    title: 'Sealwork',
    webPreferences: {
      preload: join(PROJECT_ROOT, 'dist', 'electron', 'preload.cjs'),
      contextIsolation: true,
      sandbox: true,
      nodeIntegration: false,
      webSecurity: true,
      spellcheck: true,
      devTools: !app.isPackaged,
      disableBlinkFeatures: 'Auxclick',
    },
  });
  if (bounds.maximized) window.maximize();
  window.once('ready-to-show', () => window.show());
  window.on('close', () => {
    saveWindowBounds(statePath, { ...window.getNormalBounds(), maximized: window.isMaximized() });
  });
  // The page holds back closing while typed figures are not saved (its beforeunload); the
  // window asks the person instead of closing silently or losing them.
  window.webContents.on('will-prevent-unload', (event) => {
    const choice = dialog.showMessageBoxSync(window, {
      type: 'question',
      buttons: ['Stay and save them', 'Close without them'],
      defaultId: 0,
      cancelId: 0,
      title: 'Figures not saved',
      message: 'Some figures you typed are not saved yet.',
      detail:
        'They are still in their boxes, most often because Sealwork could not accept them as typed.',
    });
    if (choice === 1) event.preventDefault(); // preventing the prevention lets the page close
  });
  window.webContents.on('will-navigate', (event, url) => {
    if (!mayNavigate(url)) event.preventDefault();
  });
  window.webContents.setWindowOpenHandler(({ url }) => {
    const decision = windowOpenDecision(url);
    // Hand the browser the URL as we parsed it, so no other parser can read it differently.
    if (decision.openExternally && mayOpenExternally(url))
      void shell.openExternal(new URL(url).href);
    return { action: decision.action };
  });
  Menu.setApplicationMenu(buildMenu(window, store));
  void window.loadURL('app://sealwork/');
  return window;
}

/** No page may use the camera, microphone, location, notifications or any other permission. */
function denyPermissions(): void {
  session.defaultSession.setPermissionRequestHandler((_contents, _permission, answer) =>
    answer(false),
  );
  session.defaultSession.setPermissionCheckHandler(() => false);
}

/** Bounds on a screen that still exists: a window saved on a removed monitor comes back. */
function onScreen(
  bounds: ReturnType<typeof loadWindowBounds>,
): ReturnType<typeof loadWindowBounds> {
  if (bounds.x === undefined || bounds.y === undefined) return bounds;
  const area = screen.getDisplayMatching({
    x: bounds.x,
    y: bounds.y,
    width: bounds.width,
    height: bounds.height,
  }).workArea;
  const inside =
    bounds.x >= area.x &&
    bounds.y >= area.y &&
    bounds.x + 100 <= area.x + area.width &&
    bounds.y + 100 <= area.y + area.height;
  return inside ? bounds : { width: bounds.width, height: bounds.height };
}

function start(): void {
  if (!app.requestSingleInstanceLock()) {
    app.quit();
    return;
  }
  const { values } = parseArgs({
    args: process.argv.slice(2),
    options: {
      db: { type: 'string' },
      demo: { type: 'boolean' },
      'no-open': { type: 'boolean' },
      browser: { type: 'boolean' },
    },
    strict: false,
  });
  void app.whenReady().then(() => {
    denyPermissions();
    const electronVersion = process.versions.electron ?? '';
    // Installed, the addon ships beside the app (unpacked from the asar); from the repository
    // it is built once for this Electron.
    const nativeBinding = app.isPackaged
      ? electronAddonPath(PROJECT_ROOT, electronVersion).replace('app.asar', 'app.asar.unpacked')
      : ensureElectronAddon(PROJECT_ROOT, electronVersion);
    const path = typeof values.db === 'string' ? values.db : defaultProjectPath();
    const { store } = openProject(path, {
      demoWhenNew: values.db === undefined || values.demo === true,
      nativeBinding,
    });
    openedProject = { path, nativeBinding };
    serveApp();
    exposeChannels(store);
    exposeHomeFileSaving(store);
    exposeProposalAnswers();
    let window = createWindow(store);
    app.on('second-instance', () => {
      if (window.isMinimized()) window.restore();
      window.focus();
    });
    app.on('activate', () => {
      if (BrowserWindow.getAllWindows().length === 0) window = createWindow(store);
    });
    app.on('window-all-closed', () => {
      store.close();
      app.quit();
    });
  });
}

start();
