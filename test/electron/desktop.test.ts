/**
 * The desktop shell's pure parts (menu, window state, channel names, the binary lookup, the
 * addon's place, the packaging configuration), and main.ts and preload.ts read as source
 * text with the TypeScript parser: they import 'electron', which cannot load here.
 *
 * Sources: Electron's "Security" tutorial (electronjs.org/docs/latest/tutorial/security;
 * items 1-17 checked in the electron/electron repository's docs/tutorial/security.md; items
 * 18 "avoid file://, prefer custom protocols", 19 "check which fuses you can change" and 20
 * "do not expose Electron APIs to untrusted web content" from memory of the current page).
 * Electron's API documents: the menu roles as listed in its own type definitions
 * (node_modules/electron/electron.d.ts, MenuItemConstructorOptions.role), the accelerator
 * grammar (docs/api/accelerator.md), the electron package's binary lookup
 * (node_modules/electron/index.js: dist/ + the name in path.txt). better-sqlite3's
 * binding.gyp names the addon. electron-builder's configuration (electron.build: the
 * electronFuses option names read there; the other option names from memory).
 */
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join, sep } from 'node:path';
import ts from 'typescript';
import { afterEach, describe, expect, it } from 'vitest';
import { CHANNEL_NAMES, ipcName } from '../../electron/channel-names.ts';
import { channels } from '../../electron/channels.ts';
import { menuTemplate, type MenuItemTemplate } from '../../electron/desktop/menu.ts';
import { electronAddonPath } from '../../electron/desktop/native-addon.ts';
import {
  DEFAULT_BOUNDS,
  loadWindowBounds,
  saveWindowBounds,
  type WindowBounds,
} from '../../electron/desktop/window-state.ts';
import { electronBinary } from '../../electron/launch.ts';
import { makeTempFolder, type TempFolder } from '../_lib/cli-harness.ts';

const ROOT = join(import.meta.dirname, '..', '..');
const text = (path: string) => readFileSync(join(ROOT, path), 'utf8');

function flatten(items: readonly MenuItemTemplate[]): MenuItemTemplate[] {
  return items.flatMap((item) => [item, ...flatten(item.submenu ?? [])]);
}
function submenu(template: MenuItemTemplate[], label: string): MenuItemTemplate[] {
  return template.find((item) => item.label === label)?.submenu ?? [];
}

/** The roles Electron 45 accepts, from its own type definitions. */
function electronMenuRoles(): Set<string> {
  const types = text('node_modules/electron/electron.d.ts');
  const block = types.slice(types.indexOf('interface MenuItemConstructorOptions'));
  const union = /role\?: \(([^)]*)\)/.exec(block)?.[1] ?? '';
  return new Set([...union.matchAll(/'([A-Za-z]+)'/g)].map((match) => match[1] ?? ''));
}

/** Electron's accelerator grammar (docs/api/accelerator.md): modifiers, then one key code. */
function isAccelerator(accelerator: string): boolean {
  const modifiers = ['Command', 'Cmd', 'Control', 'Ctrl', 'CommandOrControl', 'CmdOrCtrl'];
  modifiers.push('Alt', 'Option', 'AltGr', 'Shift', 'Super');
  const named = ['Plus', 'Space', 'Tab', 'Backspace', 'Delete', 'Insert', 'Return', 'Enter'];
  named.push('Up', 'Down', 'Left', 'Right', 'Home', 'End', 'PageUp', 'PageDown', 'Escape', 'Esc');
  const parts = accelerator.split('+');
  const key = parts.pop() ?? '';
  const keyOk =
    /^[0-9A-Z]$/.test(key) || /^F([1-9]|1[0-9]|2[0-4])$/.test(key) || named.includes(key);
  return keyOk && parts.every((part) => modifiers.includes(part));
}

describe('menu template (electron/desktop/menu.ts)', () => {
  const windows = menuTemplate({ isMac: false, devTools: false });
  const mac = menuTemplate({ isMac: true, devTools: false });

  it('has File, Edit, View and Help; the Mac adds the app menu first', () => {
    expect(windows.map((item) => item.label)).toEqual(['File', 'Edit', 'View', 'Help']);
    expect(mac[0]).toEqual({ role: 'appMenu' });
    expect(mac.slice(1).map((item) => item.label)).toEqual(['File', 'Edit', 'View', 'Help']);
  });

  it('File holds new home, import, export, backup, print proposal and quit', () => {
    const file = submenu(windows, 'File');
    const commands = file.map((item) => item.command).filter(Boolean);
    for (const command of ['newHome', 'importFile', 'exportHome', 'backup', 'printProposal'])
      expect(commands).toContain(command);
    expect(file.at(-1)).toEqual({ role: 'quit' });
    // On the Mac, Quit lives in the app menu (Apple's menu convention, from memory); File closes.
    expect(flatten(mac).some((item) => item.role === 'quit')).toBe(false);
    expect(submenu(mac, 'File').at(-1)).toEqual({ role: 'close' });
  });

  it('Edit carries the clipboard and undo roles', () => {
    const roles = submenu(windows, 'Edit').map((item) => item.role);
    expect(roles).toEqual(expect.arrayContaining(['undo', 'redo', 'cut', 'copy', 'paste']));
    expect(roles).toContain('selectAll');
  });

  it('offers the developer tools only when asked to', () => {
    for (const isMac of [false, true]) {
      const without = flatten(menuTemplate({ isMac, devTools: false }));
      expect(without.some((item) => item.role === 'toggleDevTools')).toBe(false);
      const view = submenu(menuTemplate({ isMac, devTools: true }), 'View');
      expect(view.some((item) => item.role === 'toggleDevTools')).toBe(true);
    }
  });

  it("uses only roles Electron 45 knows, and accelerators of Electron's grammar, each once", () => {
    const known = electronMenuRoles();
    expect(known.has('toggleDevTools')).toBe(true);
    const items = flatten(menuTemplate({ isMac: true, devTools: true }));
    for (const item of items) if (item.role) expect(known).toContain(item.role);
    const accelerators = items.flatMap((item) => (item.accelerator ? [item.accelerator] : []));
    for (const accelerator of accelerators)
      expect(isAccelerator(accelerator), accelerator).toBe(true);
    expect(new Set(accelerators).size).toBe(accelerators.length);
    // The Edit and View roles bring Z, X, C, V, A, 0 and F11 (Electron's role defaults, from memory).
    const taken = ['CmdOrCtrl+Z', 'CmdOrCtrl+X', 'CmdOrCtrl+C', 'CmdOrCtrl+V', 'CmdOrCtrl+A'];
    for (const accelerator of [...taken, 'CmdOrCtrl+0', 'F11'])
      expect(accelerators).not.toContain(accelerator);
  });

  it('gives every command a label, once, and never starts, ends or doubles a separator', () => {
    const items = flatten(windows);
    const commands = items.flatMap((item) => (item.command ? [item.command] : []));
    expect(new Set(commands).size).toBe(commands.length);
    for (const item of items) if (item.command) expect(item.label?.length).toBeGreaterThan(0);
    for (const top of windows) {
      const kinds = (top.submenu ?? []).map((item) => item.type === 'separator');
      expect(kinds[0]).toBe(false);
      expect(kinds.at(-1)).toBe(false);
      expect(kinds.some((isSeparator, i) => isSeparator && kinds[i + 1] === true)).toBe(false);
    }
  });
});

describe('window state (electron/desktop/window-state.ts)', () => {
  let folder: TempFolder | null = null;
  const place = (name: string) => {
    folder ??= makeTempFolder('sealwork-window-');
    return join(folder.path, name);
  };
  afterEach(() => {
    folder?.remove();
    folder = null;
  });

  it('gives the default size for a missing, unreadable or foreign file', () => {
    expect(loadWindowBounds(place('missing.json'))).toEqual(DEFAULT_BOUNDS);
    const cases: unknown[] = ['{not json', '[]', '"1280x800"', 'null', { width: 1280 }];
    cases.push({ width: '1280', height: 800 }, { width: 1280, height: 800, colour: 'blue' });
    for (const [index, content] of cases.entries()) {
      const file = place(`case-${index}.json`);
      folder?.write(`case-${index}.json`, content);
      expect(loadWindowBounds(file), JSON.stringify(content)).toEqual(DEFAULT_BOUNDS);
    }
  });

  it('gives the default size for sizes out of range or not whole pixels', () => {
    const sizes = [
      [799, 800],
      [1280, 599],
      [10_001, 800],
      [1280, 10_001],
      [0, 0],
      [-1280, 800],
      [1280.5, 800],
    ];
    for (const [width, height] of sizes) {
      const file = place(`${width}x${height}.json`);
      folder?.write(`${width}x${height}.json`, { width, height });
      expect(loadWindowBounds(file)).toEqual(DEFAULT_BOUNDS);
    }
  });

  it('round-trips a valid state, edges of the range included', () => {
    const states: WindowBounds[] = [
      { x: -1900, y: 40, width: 1440, height: 900, maximized: true },
      { width: 800, height: 600 },
      { x: 0, y: 0, width: 10_000, height: 10_000, maximized: false },
      DEFAULT_BOUNDS,
    ];
    for (const [index, state] of states.entries()) {
      const file = place(`state-${index}.json`);
      saveWindowBounds(file, state);
      expect(loadWindowBounds(file)).toEqual(state);
    }
  });

  it('never writes an invalid state, and leaves the last good one', () => {
    const file = place('state.json');
    saveWindowBounds(file, { width: 100, height: 100 });
    expect(existsSync(file)).toBe(false);
    const good: WindowBounds = { x: 10, y: 20, width: 1300, height: 820 };
    saveWindowBounds(file, good);
    const bad = [
      { ...good, width: Number.NaN },
      { ...good, height: Infinity },
      { ...good, x: 1.5 },
    ];
    for (const state of bad) saveWindowBounds(file, state);
    saveWindowBounds(file, { ...good, extra: 1 } as WindowBounds);
    expect(loadWindowBounds(file)).toEqual(good);
  });
});

describe('channel names (electron/channel-names.ts)', () => {
  it('are exactly the keys of the channel table, in its order, with no duplicate', () => {
    expect([...CHANNEL_NAMES]).toEqual(Object.keys(channels));
    expect(new Set(CHANNEL_NAMES).size).toBe(CHANNEL_NAMES.length);
  });

  it('map to IPC names under the sealwork: prefix, apart from the menu event and each other', () => {
    const names = CHANNEL_NAMES.map((name) => ipcName(name));
    for (const [index, name] of names.entries())
      expect(name).toBe(`sealwork:${CHANNEL_NAMES[index]}`);
    expect(new Set(names).size).toBe(names.length);
    expect(names).not.toContain('sealwork:menu');
    for (const name of CHANNEL_NAMES) expect(name).toMatch(/^[a-z][A-Za-z]*\.[a-z][A-Za-z]*$/);
  });
});

describe('the Electron binary and the native addon', () => {
  it('electronBinary() is null where the electron package holds no binary, as here', () => {
    // electronBinary() takes no folder to look in, so only this machine's case is tested.
    const folder = join(ROOT, 'node_modules', 'electron');
    const pathFile = join(folder, 'path.txt');
    const expected = existsSync(pathFile)
      ? join(folder, 'dist', readFileSync(pathFile, 'utf8').trim())
      : null;
    expect(electronBinary()).toBe(expected !== null && existsSync(expected) ? expected : null);
    // It never loads the package's index.js, which downloads a missing binary.
    const loaded = Object.keys(createRequire(import.meta.url).cache);
    expect(loaded.filter((key) => key.endsWith(join('electron', 'index.js')))).toEqual([]);
  });

  it("electronAddonPath names better-sqlite3's addon in a folder per Electron version", () => {
    const addon = electronAddonPath('/opt/sealwork', '45.5.0');
    const expected = ['', 'opt', 'sealwork', 'node_modules', '.sealwork-native'];
    expect(addon.split(sep)).toEqual([...expected, 'electron-45.5.0', 'better_sqlite3.node']);
    // node-gyp writes build/Release/<target_name>.node; binding.gyp names the target.
    const gyp = text('node_modules/better-sqlite3/binding.gyp');
    expect(gyp).toContain("'target_name': 'better_sqlite3'");
    expect(electronAddonPath('/opt/sealwork', '46.0.0')).not.toBe(addon);
  });
});

// ---- main.ts and preload.ts, read as TypeScript syntax trees -------------------------------

function parseSource(path: string): ts.SourceFile {
  return ts.createSourceFile(path, text(path), ts.ScriptTarget.ES2022, true, ts.ScriptKind.TS);
}
function nodesOf<T extends ts.Node>(root: ts.Node, is: (node: ts.Node) => node is T): T[] {
  const found: T[] = [];
  const visit = (node: ts.Node): void => {
    if (is(node)) found.push(node);
    ts.forEachChild(node, visit);
  };
  visit(root);
  return found;
}
/** Calls whose callee reads `callee` (`ipcMain.handle`) or ends with `.callee` (`.on`). */
function callsTo(root: ts.Node, callee: string): ts.CallExpression[] {
  return nodesOf(root, ts.isCallExpression).filter((call) => {
    const name = call.expression.getText();
    return callee.startsWith('.') ? name.endsWith(callee) : name === callee;
  });
}
function ancestors(node: ts.Node): ts.Node[] {
  const chain: ts.Node[] = [];
  for (let up = node.parent; up; up = up.parent) chain.push(up);
  return chain;
}
function propertiesOf(object: ts.Node | undefined): Map<string, string> {
  const map = new Map<string, string>();
  if (!object || !ts.isObjectLiteralExpression(object)) return map;
  for (const property of object.properties) {
    if (ts.isPropertyAssignment(property))
      map.set(property.name.getText(), property.initializer.getText());
    else map.set(property.getText(), '(not a plain property)');
  }
  return map;
}
/** The first `if (...) return` of a handler whose condition negates the sender check. */
function senderGuard(handler: ts.Node): ts.IfStatement | undefined {
  const body = ts.isFunctionLike(handler) ? (handler as ts.ArrowFunction).body : undefined;
  if (!body || !ts.isBlock(body)) return undefined;
  const checked = new Set<string>();
  for (const statement of body.statements) {
    if (ts.isVariableStatement(statement))
      for (const declaration of statement.declarationList.declarations)
        if (declaration.initializer?.getText().includes('isTrustedSender('))
          checked.add(declaration.name.getText());
    if (!ts.isIfStatement(statement)) continue;
    const condition = statement.expression.getText();
    const negates =
      condition.includes('!isTrustedSender(') ||
      [...checked].some((name) => new RegExp(`!\\s*${name}\\b`).test(condition));
    const returns =
      nodesOf(statement.thenStatement, ts.isReturnStatement).length > 0 ||
      ts.isReturnStatement(statement.thenStatement);
    if (negates && returns) return statement;
  }
  return undefined;
}

describe('main.ts, read as source', () => {
  const main = parseSource('electron/main.ts');
  const windows = nodesOf(main, ts.isNewExpression).filter(
    (n) => n.expression.getText() === 'BrowserWindow',
  );

  it('opens one window, isolated, sandboxed, without Node (checklist items 2, 3, 4, 6, 8-10)', () => {
    expect(windows).toHaveLength(1);
    const options = propertiesOf(windows[0]?.arguments?.[0]);
    const preferences = propertiesOf(
      (windows[0]?.arguments?.[0] as ts.ObjectLiteralExpression | undefined)?.properties
        .filter(ts.isPropertyAssignment)
        .find((p) => p.name.getText() === 'webPreferences')?.initializer,
    );
    expect(options.has('webPreferences')).toBe(true);
    expect(preferences.get('contextIsolation')).toBe('true'); // item 3
    expect(preferences.get('sandbox')).toBe('true'); // item 4
    expect(preferences.get('nodeIntegration')).toBe('false'); // item 2
    for (const key of ['nodeIntegrationInWorker', 'nodeIntegrationInSubFrames', 'webviewTag'])
      expect(preferences.get(key) ?? 'false').toBe('false'); // items 2, 12
    expect(preferences.get('webSecurity') ?? 'true').toBe('true'); // item 6
    for (const key of [
      'allowRunningInsecureContent',
      'experimentalFeatures',
      'enableBlinkFeatures',
    ])
      expect(preferences.has(key)).toBe(false); // items 8, 9, 10
    expect([...preferences.keys()].some((key) => key.startsWith('...'))).toBe(false);
    expect(preferences.get('preload')).toMatch(/'preload\.cjs'\)$/);
  });

  it('serves and loads only app://sealwork/, never file:// (items 1 and 18)', () => {
    const loads = [...callsTo(main, '.loadURL'), ...callsTo(main, '.loadFile')];
    expect(loads.length).toBeGreaterThan(0);
    for (const call of loads) expect(call.arguments[0]?.getText()).toMatch(/^'app:\/\/sealwork\//);
    const schemes = callsTo(main, 'protocol.registerSchemesAsPrivileged');
    expect(schemes).toHaveLength(1);
    expect(schemes[0]?.getText()).not.toMatch(/bypassCSP\s*:\s*true/); // item 7
  });

  it('registers every table channel through one handler that checks the sender first (item 17)', () => {
    expect(
      callsTo(main, '.on').filter((c) => c.expression.getText().startsWith('ipcMain')),
    ).toEqual([]);
    for (const method of ['ipcMain.handleOnce', 'ipcMain.once', 'ipcMain.addListener'])
      expect(callsTo(main, method)).toEqual([]);
    const handles = callsTo(main, 'ipcMain.handle');
    const table = handles.filter((call) => call.arguments[0]?.getText() === 'ipcName(name)');
    expect(table).toHaveLength(1);
    const loop = ancestors(table[0] as ts.Node).find(ts.isForOfStatement);
    expect(loop?.expression.getText()).toBe('CHANNEL_NAMES');
    const tableNames = new Set(CHANNEL_NAMES.map((name) => ipcName(name)));
    // The one checkpoint: `guarded(handler)` checks the sender and refuses before the
    // handler runs, so work inside a guarded handler cannot run first.
    const guardedFunction = nodesOf(main, ts.isFunctionDeclaration).find(
      (declaration) => declaration.name?.getText() === 'guarded',
    );
    const guardedText = guardedFunction?.getText() ?? '';
    expect(guardedText).toContain('isTrustedSender(');
    expect(guardedText).toMatch(/return trusted \? handler\(event, request\) : REFUSED/);
    for (const call of handles) {
      const handler = call.arguments[1] as ts.Node;
      const wrapped = ts.isCallExpression(handler) && handler.expression.getText() === 'guarded';
      const guard = wrapped ? handler : senderGuard(handler);
      expect(guard, call.arguments[0]?.getText()).toBeDefined();
      // Nothing that reads, writes or asks the user runs before the refusal.
      if (!wrapped) {
        for (const work of ['callChannel', 'dialog.showSaveDialog', 'writeFileSync'])
          for (const use of callsTo(handler, work))
            expect(use.pos).toBeGreaterThan(guard?.end ?? Infinity);
      }
      if (call !== table[0]) {
        const channel = call.arguments[0];
        expect(channel && ts.isStringLiteral(channel)).toBe(true);
        const name = (channel as ts.StringLiteral).text;
        expect(name.startsWith('sealwork:')).toBe(true);
        expect(tableNames.has(name) || name === 'sealwork:menu').toBe(false);
      }
    }
  });

  it('wires will-navigate and setWindowOpenHandler to the security rules (items 13, 14)', () => {
    const navigate = callsTo(main, '.on').filter(
      (c) => c.arguments[0]?.getText() === "'will-navigate'",
    );
    expect(navigate).toHaveLength(1);
    const listener = navigate[0]?.arguments[1]?.getText() ?? '';
    expect(listener).toMatch(/if \(!mayNavigate\(\w+\)\) \w+\.preventDefault\(\)/);
    const opens = callsTo(main, '.setWindowOpenHandler');
    expect(opens).toHaveLength(1);
    const returns = nodesOf(opens[0] as ts.Node, ts.isReturnStatement).map((r) => r.getText());
    expect(opens[0]?.getText()).toContain('windowOpenDecision(');
    expect(returns).toEqual(['return { action: decision.action };']);
  });

  it('calls shell.openExternal only behind mayOpenExternally (item 15)', () => {
    const external = callsTo(main, 'shell.openExternal');
    expect(external.length).toBeGreaterThan(0);
    for (const call of external) {
      const guards = ancestors(call).filter(ts.isIfStatement);
      expect(guards.some((g) => g.expression.getText().includes('mayOpenExternally('))).toBe(true);
    }
  });

  it('sets the Content-Security-Policy on every app:// response (item 7)', () => {
    const handler = callsTo(main, 'protocol.handle');
    expect(handler).toHaveLength(1);
    const sets = callsTo(handler[0] as ts.Node, 'headers.set').map((c) => c.getText());
    expect(sets).toContain("headers.set('Content-Security-Policy', CONTENT_SECURITY_POLICY)");
  });
});

describe('preload.ts, read as source (items 3 and 20)', () => {
  const preload = parseSource('electron/preload.ts');

  it('imports only electron and the channel names', () => {
    const imports = preload.statements
      .filter(ts.isImportDeclaration)
      .map((d) => d.moduleSpecifier.getText());
    expect(imports.sort()).toEqual(["'./channel-names.ts'", "'electron'"]);
  });

  it('exposes one frozen object through one exposeInMainWorld call', () => {
    const exposes = callsTo(preload, '.exposeInMainWorld');
    expect(exposes).toHaveLength(1);
    expect(exposes[0]?.expression.getText()).toBe('contextBridge.exposeInMainWorld');
    expect(exposes[0]?.arguments[1]?.getText()).toMatch(/^Object\.freeze\(/);
    // Nothing else of contextBridge is used (no exposeInIsolatedWorld, no handing it over).
    const bridgeUses = nodesOf(preload, ts.isIdentifier).filter(
      (id) => id.text === 'contextBridge',
    );
    const uses = bridgeUses
      .filter((id) => !ts.isImportSpecifier(id.parent))
      .map((id) => id.parent.getText());
    expect(uses).toEqual(['contextBridge.exposeInMainWorld']);
  });

  it('never hands ipcRenderer itself to anyone: it is only ever called', () => {
    const uses = nodesOf(preload, ts.isIdentifier).filter((id) => id.text === 'ipcRenderer');
    for (const use of uses) {
      if (ts.isImportSpecifier(use.parent)) continue;
      expect(
        ts.isPropertyAccessExpression(use.parent) && use.parent.expression === use,
        use.parent.getText(),
      ).toBe(true);
      expect(ts.isCallExpression(use.parent.parent), use.parent.parent.getText()).toBe(true);
    }
  });

  it('has no generic invoke: no IPC name comes from a caller', () => {
    const sends = ['invoke', 'send', 'sendSync', 'postMessage'].flatMap((m) =>
      callsTo(preload, `ipcRenderer.${m}`),
    );
    expect(sends.length).toBeGreaterThan(0);
    for (const call of sends) {
      const channel = call.arguments[0];
      const parameters = ancestors(call)
        .filter(ts.isFunctionLike)
        .flatMap((fn) => (fn as ts.ArrowFunction).parameters.map((p) => p.name.getText()));
      if (channel && ts.isStringLiteral(channel)) {
        expect(channel.text.startsWith('sealwork:')).toBe(true);
        continue;
      }
      const named = channel ? [channel, ...nodesOf(channel, ts.isIdentifier)] : [];
      const fromCaller = named.filter((n) => ts.isIdentifier(n) && parameters.includes(n.text));
      expect(
        fromCaller.map((n) => n.getText()),
        call.getText(),
      ).toEqual([]);
    }
  });

  it('never passes the IPC event (which carries the sender) to the page', () => {
    for (const call of callsTo(preload, 'ipcRenderer.on')) {
      const listener = call.arguments[1];
      expect(listener && ts.isArrowFunction(listener)).toBe(true);
      const event = (listener as ts.ArrowFunction).parameters[0]?.name.getText() ?? '';
      const used = nodesOf((listener as ts.ArrowFunction).body, ts.isIdentifier).some(
        (id) => id.text === event,
      );
      expect(used).toBe(false);
    }
  });
});

// ---- the electron-builder configuration (package.json "build"), which cannot run here ----

interface FileSet {
  from: string;
  to: string;
  filter: string[];
}
interface BuildConfig {
  appId: string;
  productName: string;
  extraMetadata: { main: string };
  files: (string | FileSet)[];
  asarUnpack: string[];
  npmRebuild: boolean;
  electronFuses: Record<string, boolean>;
  linux: { target: string[]; maintainer: string };
  win: { target: string[] };
  mac: { target: string[] };
}

describe('packaging configuration (package.json "build")', () => {
  const packageJson = JSON.parse(text('package.json')) as {
    build: BuildConfig;
    scripts: Record<string, string>;
  };
  const build = packageJson.build;
  const patterns = build.files.filter((entry): entry is string => typeof entry === 'string');

  it('names the app under an invented domain and ships the four targets', () => {
    // Reverse-DNS; the .example top-level domain is reserved for examples (RFC 2606), so the
    // invented name is nobody's. electron-builder's own default would be com.electron.<name>.
    expect(build.appId).toMatch(/^[a-z][a-z0-9-]*(\.[a-z][a-z0-9-]*)+$/);
    expect(build.appId.split('.')[0]).toBe('example');
    expect(build.productName).toBe('Sealwork');
    expect(build.linux.target).toEqual(['AppImage', 'deb']);
    expect(build.win.target).toEqual(['nsis']);
    expect(build.mac.target).toEqual(['dmg']);
    // A deb needs a maintainer with an e-mail address (Debian Policy 5.6.2, from memory).
    expect(build.linux.maintainer).toMatch(/^.+ <[^@\s]+@[^@\s]+>$/);
  });

  it('starts the bundle electron/desktop/build.ts writes and ships both bundles and the screens', () => {
    const builder = text('electron/desktop/build.ts');
    expect(builder).toContain("join(projectRoot, 'dist', 'electron')");
    for (const bundle of ['main.cjs', 'preload.cjs']) expect(builder).toContain(`'${bundle}'`);
    expect(build.extraMetadata.main).toBe('dist/electron/main.cjs');
    expect(patterns).toContain('dist/electron/*.cjs');
    expect(patterns).toContain('ui/dist/**/*');
    expect(text('electron/main.ts')).toContain(
      "join(PROJECT_ROOT, 'dist', 'electron', 'preload.cjs')",
    );
  });

  it('ships the Electron build of the addon where electronAddonPath looks, unpacked from the asar', () => {
    const addon = electronAddonPath('', '45.5.0').split(sep).filter(Boolean).join('/');
    const sets = build.files.filter((entry): entry is FileSet => typeof entry !== 'string');
    const folder = 'node_modules/.sealwork-native';
    expect(sets).toContainEqual({ from: folder, to: folder, filter: ['**/*.node'] });
    // A native module cannot be loaded from inside an asar archive: it must be unpacked.
    const covering = build.asarUnpack.filter((pattern) => {
      const prefix = pattern.slice(0, pattern.indexOf('*'));
      return addon.startsWith(prefix) && pattern.endsWith('*.node');
    });
    expect(covering.length).toBeGreaterThan(0);
    // Left on, electron-builder would rebuild node_modules/better-sqlite3 for Electron in
    // place and break `npm test`, which needs the Node build (TOOLCHAIN.md).
    expect(build.npmRebuild).toBe(false);
  });

  it('flips the fuses that let a shipped binary run as plain Node (checklist item 19)', () => {
    expect(build.electronFuses).toMatchObject({
      runAsNode: false,
      enableNodeOptionsEnvironmentVariable: false,
      enableNodeCliInspectArguments: false,
      onlyLoadAppFromAsar: true,
      grantFileProtocolExtraPrivileges: false,
    });
  });

  it('runs the electronegativity gate as npm run lint:electron', () => {
    expect(packageJson.scripts['lint:electron']).toBe(
      'tsx electron/tools/run-electronegativity.ts',
    );
  });
});
