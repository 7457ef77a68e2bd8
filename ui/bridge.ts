/**
 * The one door from the screens to the host. In the desktop window the preload exposes
 * `window.sealwork`, one method per channel. In a plain browser the page talks to the browser
 * host over HTTP (`POST /api/<channel>`), proving itself with the token the host put in the
 * page address's fragment. Either way a call resolves to the channel's reply and never
 * throws: a host that cannot be reached becomes an error reply in plain words.
 */
import type {
  ChannelError,
  ChannelName,
  ChannelRequest,
  ChannelResponse,
  Reply,
} from '../electron/channels.ts';

/** What the desktop preload puts on `window`: one method per channel (see electron/preload.ts). */
type DesktopBridge = {
  readonly [Name in ChannelName]: (
    request: ChannelRequest<Name>,
  ) => Promise<Reply<ChannelResponse<Name>>>;
};

/** What the desktop preload adds beside the channels: the menu and the native dialogs. */
interface DesktopExtras {
  onMenuCommand(listener: (command: string) => void): void;
  saveHomeFile(request: { id: number }): Promise<unknown>;
  proposalShown(answer: { shown: boolean; why: string }): Promise<unknown>;
}

declare global {
  interface Window {
    sealwork?: DesktopBridge & DesktopExtras;
  }
}

type Transport = <Name extends ChannelName>(
  name: Name,
  request: ChannelRequest<Name>,
) => Promise<Reply<ChannelResponse<Name>>>;

const TOKEN_KEY = 'sealwork.token';
const TOKEN_HEADER = 'x-sealwork-token';

let transport: Transport | null = null;

function failure(kind: string, message: string): { ok: false; error: ChannelError } {
  return { ok: false, error: { kind, message } };
}

function storedToken(): string | null {
  try {
    return sessionStorage.getItem(TOKEN_KEY);
  } catch {
    return null; // storage turned off: the token lives only as long as this page
  }
}

function keepToken(token: string): void {
  try {
    sessionStorage.setItem(TOKEN_KEY, token);
  } catch {
    // Without storage a reload loses the token; the error reply then says what to do.
  }
}

/**
 * The browser host's token: taken from `#token=…` once, kept for reloads of this tab, and
 * removed from the address bar so it is not bookmarked, shared or shown over a shoulder.
 */
function takeToken(): string | null {
  const fromAddress = new URLSearchParams(location.hash.slice(1)).get('token');
  if (fromAddress) {
    keepToken(fromAddress);
    history.replaceState(history.state, '', `${location.pathname}${location.search}`);
    return fromAddress;
  }
  return storedToken();
}

function desktopTransport(desktop: DesktopBridge): Transport {
  return async (name, request) => {
    try {
      return await desktop[name](request);
    } catch {
      return failure(
        'unreachable',
        'Sealwork’s window lost touch with the app. Close and reopen it.',
      );
    }
  };
}

function httpFailure(status: number): { ok: false; error: ChannelError } {
  if (status === 401) {
    return failure(
      'unauthorized',
      'This page’s access key is missing or out of date. Open Sealwork again from the address it printed when it started.',
    );
  }
  if (status === 403) {
    return failure('forbidden', 'Sealwork refused this page. Open it from the address it printed.');
  }
  return failure('unexpected', `Sealwork answered with an error (HTTP ${status}).`);
}

function browserTransport(token: string | null): Transport {
  return async (name, request) => {
    if (token === null) return httpFailure(401);
    let response: Response;
    try {
      response = await fetch(`/api/${name}`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', [TOKEN_HEADER]: token },
        body: JSON.stringify(request),
        credentials: 'omit',
      });
    } catch {
      return failure(
        'unreachable',
        'Sealwork could not be reached. It may have been closed; start it again and reopen this page.',
      );
    }
    try {
      // A channel's refusal (bad request, too large) still carries a reply to show.
      return (await response.json()) as Reply<ChannelResponse<typeof name>>;
    } catch {
      return httpFailure(response.status);
    }
  };
}

/**
 * Finds the host once: the desktop bridge when the page runs in Sealwork's window, else the
 * browser host (reading and clearing the token in the address). Call it at start-up so the
 * token leaves the address bar at once; `call` also calls it.
 */
export function connectBridge(): void {
  currentTransport();
}

function currentTransport(): Transport {
  transport ??= window.sealwork ? desktopTransport(window.sealwork) : browserTransport(takeToken());
  return transport;
}

/**
 * Calls one channel of the host.
 *
 * @param name - the channel, as in electron/channels.ts
 * @param request - its request
 * @returns the channel's reply; a host that cannot be reached gives `{ ok: false }` too
 */
export function call<Name extends ChannelName>(
  name: Name,
  request: ChannelRequest<Name>,
): Promise<Reply<ChannelResponse<Name>>> {
  return currentTransport()(name, request);
}

/**
 * Listens to the desktop menu's commands (new home, print the proposal, shortcuts…).
 *
 * @returns false in a plain browser, where there is no menu bar of Sealwork's own
 */
export function onMenuCommand(listener: (command: string) => void): boolean {
  if (!window.sealwork) return false;
  window.sealwork.onMenuCommand(listener);
  return true;
}

/** Tells the desktop app whether the proposal it asked to print is drawn, or why not. */
export function answerProposalRequest(answer: { shown: boolean; why: string }): void {
  void window.sealwork?.proposalShown(answer);
}

/** Saves a home as a file with the desktop's save dialog; false in a plain browser. */
export function saveHomeFileWithDialog(homeId: number): boolean {
  if (!window.sealwork) return false;
  void window.sealwork.saveHomeFile({ id: homeId });
  return true;
}
