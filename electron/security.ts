/**
 * The security rules of the hosts as plain functions, so they are tested without Electron:
 * which frames may call a channel, where the window may navigate, which external links open,
 * the Content Security Policy, and which Host and Origin headers the browser host accepts.
 */

/** The only scheme and host the desktop window loads its pages from. */
export const APP_ORIGIN = 'app://sealwork';

/** External sites a link in the app may open in the system browser (https only). */
export const EXTERNAL_ALLOW_LIST: readonly string[] = [
  'www.ashrae.org',
  'www.nist.gov',
  'www.energy.gov',
  'www.epa.gov',
];

/**
 * The Content Security Policy of every page: scripts, styles, fonts and images only from the
 * app itself, calls only back to it, no plugins, no framing, no base or form tricks.
 */
export const CONTENT_SECURITY_POLICY = [
  "default-src 'none'",
  "script-src 'self'",
  "style-src 'self'",
  "img-src 'self' data:",
  "font-src 'self'",
  "connect-src 'self'",
  "object-src 'none'",
  "base-uri 'none'",
  "form-action 'none'",
  "frame-ancestors 'none'",
].join('; ');

function parsedUrl(text: string): URL | null {
  try {
    return new URL(text);
  } catch {
    return null;
  }
}

/**
 * Whether a URL is one of the app's own pages. A custom scheme has an opaque origin
 * ("null"), so the scheme, host and the absence of userinfo are compared themselves.
 */
function isAppUrl(text: string): boolean {
  const url = parsedUrl(text);
  return (
    url !== null &&
    url.protocol === 'app:' &&
    url.host === 'sealwork' &&
    url.username === '' &&
    url.password === ''
  );
}

/**
 * Whether a message to the main process comes from the app's own page.
 *
 * @param sender.url - the sending frame's URL, parsed with a real URL parser
 * @param sender.isMainFrame - messages from sub-frames are refused
 */
export function isTrustedSender(sender: { url: string; isMainFrame: boolean }): boolean {
  if (!sender.isMainFrame) return false;
  return isAppUrl(sender.url);
}

/** The window never navigates away from the app (a click on a link opens nothing in it). */
export function mayNavigate(targetUrl: string): boolean {
  return isAppUrl(targetUrl);
}

/** Whether a link may be opened in the system browser: https to an allow-listed host. */
export function mayOpenExternally(targetUrl: string): boolean {
  const url = parsedUrl(targetUrl);
  return (
    url !== null &&
    url.protocol === 'https:' &&
    url.username === '' &&
    url.password === '' &&
    url.port === '' &&
    EXTERNAL_ALLOW_LIST.includes(url.hostname)
  );
}

/** What to do with a page's `window.open`: never a new window; allowed links go to the browser. */
export function windowOpenDecision(targetUrl: string): { action: 'deny'; openExternally: boolean } {
  return { action: 'deny', openExternally: mayOpenExternally(targetUrl) };
}

/**
 * Whether a request's Host header names the browser host itself (defeats DNS rebinding: a
 * foreign page that points its own name at 127.0.0.1 still sends its own name as Host).
 */
export function isLocalHost(hostHeader: string | undefined, port: number): boolean {
  return hostHeader === `127.0.0.1:${port}` || hostHeader === `localhost:${port}`;
}

/** Whether an Origin header, when present, is the browser host's own origin. */
export function isOwnOrigin(originHeader: string | undefined, port: number): boolean {
  if (originHeader === undefined) return true;
  return originHeader === `http://127.0.0.1:${port}` || originHeader === `http://localhost:${port}`;
}

/** Compares two tokens in time independent of where they differ. */
export function tokensMatch(given: string | undefined, expected: string): boolean {
  if (expected.length === 0 || given === undefined || given.length !== expected.length) {
    return false;
  }
  let difference = 0;
  for (let index = 0; index < expected.length; index += 1) {
    difference |= given.charCodeAt(index) ^ expected.charCodeAt(index);
  }
  return difference === 0;
}
