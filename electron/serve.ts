/**
 * The browser host: the same channel table over HTTP on 127.0.0.1, for machines without the
 * Electron binary and for the end-to-end tests. It binds loopback only, on a free port, and
 * guards against other web pages on the same machine:
 * - a Host or Origin other than its own gets 403 on every path (DNS rebinding, cross-site);
 * - every /api/ request needs this run's random token (`X-Sealwork-Token`), else 401;
 * - no CORS headers are ever sent; request bodies are limited in size (2 MiB; a photo more).
 * Channels are `POST /api/<channel>` with a JSON body; replies are the channel's reply.
 */
import { randomBytes } from 'node:crypto';
import { createReadStream, existsSync, statSync } from 'node:fs';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { extname, join, normalize, sep } from 'node:path';
import { MAX_PHOTO_BASE64_CHARS } from '../db/home-file-bundle.ts';
import { callChannel, isChannelName, type ChannelContext, type ChannelName } from './channels.ts';
import { CONTENT_SECURITY_POLICY, isLocalHost, isOwnOrigin, tokensMatch } from './security.ts';

/** The largest request body accepted, bytes (a home file with many measures fits easily). */
export const MAX_BODY_BYTES = 2 * 1024 * 1024;

/**
 * The largest body of a photos.add request, bytes: the largest photo the store takes as base64
 * (15 MiB of image, 20 MiB of text) with the usual limit again for the rest (caption, JSON).
 * Only that channel gets it, and homeFile.import (a home file may come bundled with a photo);
 * every other keeps {@link MAX_BODY_BYTES}.
 */
export const MAX_PHOTO_BODY_BYTES = MAX_PHOTO_BASE64_CHARS + MAX_BODY_BYTES;

/** The body limit of a channel, bytes. */
export function bodyLimitOf(name: ChannelName): number {
  return name === 'photos.add' || name === 'homeFile.import'
    ? MAX_PHOTO_BODY_BYTES
    : MAX_BODY_BYTES;
}

export const TOKEN_HEADER = 'x-sealwork-token';

const CONTENT_TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.woff2': 'font/woff2',
};

const SECURITY_HEADERS: Record<string, string> = {
  'Content-Security-Policy': CONTENT_SECURITY_POLICY,
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'no-referrer',
  'Cross-Origin-Opener-Policy': 'same-origin',
  'Cross-Origin-Resource-Policy': 'same-origin',
  'X-Frame-Options': 'DENY',
  'Cache-Control': 'no-store',
};

export interface BrowserHost {
  server: Server;
  port: number;
  token: string;
  /** The address to open, with the token in the fragment (never sent to a server). */
  url: string;
  close(): Promise<void>;
}

function send(
  response: ServerResponse,
  status: number,
  body: string,
  type = 'text/plain; charset=utf-8',
): void {
  response.writeHead(status, {
    ...SECURITY_HEADERS,
    'Content-Type': type,
    'Content-Length': Buffer.byteLength(body),
  });
  response.end(body);
}

function sendJson(response: ServerResponse, status: number, value: unknown): void {
  send(response, status, JSON.stringify(value), 'application/json; charset=utf-8');
}

/** Reads a request body up to `limitBytes`; null when it is larger. */
function readBody(request: IncomingMessage, limitBytes: number): Promise<string | null> {
  return new Promise((resolve, reject) => {
    const declared = Number(request.headers['content-length'] ?? 0);
    if (declared > limitBytes) {
      resolve(null);
      request.resume();
      return;
    }
    const chunks: Buffer[] = [];
    let size = 0;
    let tooLarge = false;
    request.on('data', (chunk: Buffer) => {
      if (tooLarge) return; // the rest is read and dropped, so the 413 reaches the client
      size += chunk.length;
      if (size > limitBytes) {
        tooLarge = true;
        chunks.length = 0;
        resolve(null);
        return;
      }
      chunks.push(chunk);
    });
    request.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
    request.on('error', reject);
  });
}

/** A file of the built screens under `root`, or null (no escaping the folder). */
function staticFile(root: string, urlPath: string): string | null {
  let relative: string;
  try {
    relative = decodeURIComponent(urlPath.split('?')[0] ?? '/');
  } catch {
    return null; // a malformed escape names no file
  }
  const wanted = normalize(join(root, relative === '/' ? 'index.html' : relative));
  if (wanted !== root && !wanted.startsWith(root.endsWith(sep) ? root : root + sep)) return null;
  if (!existsSync(wanted) || !statSync(wanted).isFile()) return null;
  return wanted;
}

async function handle(
  request: IncomingMessage,
  response: ServerResponse,
  options: { context: ChannelContext; token: string; port: number; uiRoot: string | null },
): Promise<void> {
  const { port, token } = options;
  if (!isLocalHost(request.headers.host, port) || !isOwnOrigin(request.headers.origin, port)) {
    send(response, 403, 'Forbidden');
    return;
  }
  const path = request.url ?? '/';
  if (path.startsWith('/api/')) {
    const given = request.headers[TOKEN_HEADER];
    if (!tokensMatch(typeof given === 'string' ? given : undefined, token)) {
      send(response, 401, 'Unauthorized');
      return;
    }
    if (request.method !== 'POST') {
      send(response, 405, 'Method Not Allowed');
      return;
    }
    const name = path.slice('/api/'.length);
    if (!isChannelName(name)) {
      sendJson(response, 404, {
        ok: false,
        error: { kind: 'notFound', message: `no channel "${name}"` },
      });
      return;
    }
    const body = await readBody(request, bodyLimitOf(name));
    if (body === null) {
      sendJson(response, 413, {
        ok: false,
        error: { kind: 'invalid', message: 'the request is too large' },
      });
      return;
    }
    let payload: unknown;
    try {
      payload = body === '' ? {} : JSON.parse(body);
    } catch {
      sendJson(response, 400, {
        ok: false,
        error: { kind: 'invalid', message: 'the request is not JSON' },
      });
      return;
    }
    sendJson(response, 200, callChannel(options.context, name, payload));
    return;
  }
  if (request.method !== 'GET' && request.method !== 'HEAD') {
    send(response, 405, 'Method Not Allowed');
    return;
  }
  const file = options.uiRoot === null ? null : staticFile(options.uiRoot, path);
  if (file === null) {
    send(response, 404, 'Not Found');
    return;
  }
  response.writeHead(200, {
    ...SECURITY_HEADERS,
    'Content-Type': CONTENT_TYPES[extname(file)] ?? 'application/octet-stream',
  });
  createReadStream(file).pipe(response);
}

/**
 * Starts the browser host on 127.0.0.1 and a free port.
 *
 * @param options.uiRoot - the folder of the built screens (null serves the API only)
 * @param options.token - the token to require (a fresh random one by default)
 */
export async function startBrowserHost(options: {
  context: ChannelContext;
  uiRoot: string | null;
  port?: number;
  token?: string;
}): Promise<BrowserHost> {
  const token = options.token ?? randomBytes(32).toString('hex');
  let port = 0;
  const server = createServer((request, response) => {
    handle(request, response, {
      context: options.context,
      token,
      port,
      uiRoot: options.uiRoot,
    }).catch(() => {
      if (!response.headersSent) send(response, 500, 'Internal Server Error');
      else response.destroy();
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, '127.0.0.1', () => resolve());
  });
  const address = server.address();
  port = typeof address === 'object' && address !== null ? address.port : 0;
  return {
    server,
    port,
    token,
    url: `http://127.0.0.1:${port}/#token=${token}`,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
