/**
 * The browser host over real HTTP on loopback: the same channel table, behind a Host and
 * Origin check, a per-run token, a body limit, and static files kept inside their folder.
 * Every response the tests receive is checked for the Content-Security-Policy and for the
 * absence of any CORS header.
 *
 * Sources (Electron's checklist as read in electron/electron docs/tutorial/security.md; the
 * OWASP and WHATWG titles are from memory): OWASP on DNS rebinding (a page on a name its
 * attacker points at 127.0.0.1 still sends its own name as Host, so a loopback server must
 * refuse foreign Host headers; see the OWASP Web Security Testing Guide, "Testing for Host
 * Header Injection"); OWASP Cross-Site Request Forgery Prevention Cheat Sheet ("Verifying
 * Origin with standard headers"); WHATWG Fetch Standard, CORS protocol (without
 * Access-Control-Allow-Origin a cross-origin page cannot read a reply, and a custom header
 * such as X-Sealwork-Token forces a preflight that this host never approves); OWASP "Path
 * Traversal" attack page (the `../`, `%2e%2e/`, `..%2f`, `%252e` forms); OWASP Denial of
 * Service Cheat Sheet (limit request bodies); Electron Security tutorial, checklist item 7
 * "Define a Content Security Policy".
 */
import { createHash } from 'node:crypto';
import { mkdirSync, writeFileSync } from 'node:fs';
import { networkInterfaces } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { callChannel } from '../../electron/channels.ts';
import { CONTENT_SECURITY_POLICY } from '../../electron/security.ts';
import { MAX_PHOTO_BYTES } from '../../db/repositories/photos.ts';
import {
  MAX_BODY_BYTES,
  MAX_PHOTO_BODY_BYTES,
  startBrowserHost,
  TOKEN_HEADER,
  type BrowserHost,
} from '../../electron/serve.ts';
import { pngImage } from '../_lib/photo-bytes.ts';
import { openChannelProject, type ChannelProject } from './_lib/channel-project.ts';
import { baseHomeInput } from './_lib/channel-requests.ts';
import { httpRequest, rawHttp, type HttpCall, type HttpReply } from './_lib/http-client.ts';
import { projectDigest } from './_lib/table-digest.ts';

/** Text only the files outside the screens' folder hold; it must never come back. */
const SECRET = 'not-for-the-browser-7f3a';
const INDEX_MARKER = 'sealwork-test-index';

let project: ChannelProject;
let host: BrowserHost;
let port: number;
/** A port other than the host's (the host's own plus one; nothing needs to listen there). */
let otherPort: number;

beforeAll(async () => {
  project = openChannelProject('sealwork-serve-');
  const uiRoot = join(project.folder.path, 'ui');
  mkdirSync(uiRoot);
  writeFileSync(join(uiRoot, 'index.html'), `<!doctype html><p>${INDEX_MARKER}</p>`);
  writeFileSync(join(uiRoot, 'app.js'), 'export {};');
  writeFileSync(join(project.folder.path, 'package.json'), `{"name":"${SECRET}"}`);
  writeFileSync(join(project.folder.path, 'secret.txt'), SECRET);
  host = await startBrowserHost({ context: project.context, uiRoot });
  port = host.port;
  otherPort = port === 65_535 ? port - 1 : port + 1;
});

afterAll(async () => {
  await host.close();
  project.close();
});

/** Sends a request and checks what every response must carry. */
async function send(call: Omit<HttpCall, 'port'>): Promise<HttpReply> {
  const reply = await httpRequest({ port, ...call });
  const label = `${call.method ?? 'GET'} ${call.path} → ${reply.status}`;
  expect(reply.headers['content-security-policy'], label).toBe(CONTENT_SECURITY_POLICY);
  expect(reply.headers['x-content-type-options'], label).toBe('nosniff');
  const cors = Object.keys(reply.headers).filter((name) => name.startsWith('access-control-'));
  expect(cors, label).toEqual([]);
  return reply;
}

function withToken(extra: Record<string, string> = {}): Record<string, string> {
  return { [TOKEN_HEADER]: host.token, 'content-type': 'application/json', ...extra };
}

function post(path: string, body: string, headers = withToken()): Promise<HttpReply> {
  return send({ method: 'POST', path, body, headers });
}

const createBody = () => JSON.stringify(baseHomeInput(null));

describe('where the host listens', () => {
  it('binds 127.0.0.1 only, on the port it reports, with the token in the fragment', async () => {
    const address = host.server.address();
    expect(address).toMatchObject({ address: '127.0.0.1', family: 'IPv4', port });
    expect(host.url).toBe(`http://127.0.0.1:${port}/#token=${host.token}`);
    expect(host.token).toMatch(/^[0-9a-f]{64}$/);
    // Not on the IPv6 loopback, nor on any other interface of this machine.
    const elsewhere = Object.values(networkInterfaces())
      .flat()
      .filter((info) => info !== undefined && !info.internal && info.family === 'IPv4')
      .map((info) => info?.address ?? '');
    for (const other of ['::1', ...elsewhere]) {
      await expect(httpRequest({ port, address: other, path: '/' }), other).rejects.toThrow();
    }
  });

  it('refuses connections once closed', async () => {
    const second = await startBrowserHost({ context: project.context, uiRoot: null });
    expect((await httpRequest({ port: second.port, path: '/' })).status).toBe(404);
    await second.close();
    await expect(httpRequest({ port: second.port, path: '/' })).rejects.toThrow();
  });
});

describe('the token', () => {
  const apiPaths = ['/api/homes.list', '/api/homes.create', '/api/no.such.channel', '/api/'];

  it('is required on every /api/ path, existing channel or not (401)', async () => {
    const digest = projectDigest(project.store.sqlite);
    for (const path of [...apiPaths, '/api/__proto__']) {
      for (const method of ['POST', 'GET']) {
        const reply = await send({ method, path, body: method === 'POST' ? createBody() : '' });
        expect(reply.status, `${method} ${path}`).toBe(401);
      }
    }
    expect(projectDigest(project.store.sqlite)).toBe(digest);
  });

  it('must match exactly: same length, other lengths, other places do not pass (401)', async () => {
    const token = host.token;
    const last = token.at(-1) === '0' ? '1' : '0';
    const wrong = [
      token.slice(0, -1) + last,
      token.slice(0, -1),
      `${token}0`,
      '',
      token.toUpperCase(),
      'x'.repeat(token.length),
    ].filter((given) => given !== token);
    const digest = projectDigest(project.store.sqlite);
    for (const given of wrong) {
      const reply = await post(
        '/api/homes.create',
        createBody(),
        withToken({ [TOKEN_HEADER]: given }),
      );
      expect(reply.status, given).toBe(401);
    }
    const elsewhere: Record<string, string>[] = [
      { authorization: `Bearer ${token}` },
      { cookie: `${TOKEN_HEADER}=${token}` },
      { 'x-sealwork-token-': token },
    ];
    for (const headers of elsewhere) {
      expect((await post('/api/homes.create', createBody(), headers)).status).toBe(401);
    }
    // Sent twice, node joins the values ("t, t"): not the token.
    const twice = { [TOKEN_HEADER]: [token, token] };
    expect((await send({ method: 'POST', path: '/api/homes.list', headers: twice })).status).toBe(
      401,
    );
    expect((await post(`/api/homes.list?token=${token}`, '{}', {})).status).toBe(401);
    expect(projectDigest(project.store.sqlite)).toBe(digest);
  });
});

describe('Host and Origin (DNS rebinding, cross-site requests)', () => {
  const paths = ['/', '/index.html', '/api/homes.list'];

  it('refuses a foreign Host on every path, token or not (403)', async () => {
    const foreign = [
      `evil.example:${port}`,
      'evil.example',
      `127.0.0.1:${otherPort}`,
      `localhost:${otherPort}`,
      '127.0.0.1',
      `127.0.0.1.evil.example:${port}`,
      `localhost.evil.example:${port}`,
      `[::1]:${port}`,
      `0.0.0.0:${port}`,
      `127.0.0.2:${port}`,
    ];
    for (const name of foreign) {
      for (const path of paths) {
        const method = path.startsWith('/api/') ? 'POST' : 'GET';
        const reply = await send({ method, path, host: name, headers: withToken(), body: '{}' });
        expect(reply.status, `${name} ${path}`).toBe(403);
      }
    }
    // HTTP/1.0 may leave Host out; that is not the host's own name either.
    expect(await rawHttp(port, 'GET / HTTP/1.0\r\n\r\n')).toMatch(/^HTTP\/1\.1 403 /);
  });

  it('refuses a foreign Origin, and writes nothing for it (403)', async () => {
    const foreign = [
      'http://evil.example',
      'null',
      `http://127.0.0.1:${otherPort}`,
      `https://127.0.0.1:${port}`,
      `http://127.0.0.1:${port}.evil.example`,
      `http://localhost:${otherPort}`,
    ];
    const digest = projectDigest(project.store.sqlite);
    for (const origin of foreign) {
      const reply = await post('/api/homes.create', createBody(), withToken({ origin }));
      expect(reply.status, origin).toBe(403);
      expect((await send({ path: '/', headers: { origin } })).status, origin).toBe(403);
    }
    expect(projectDigest(project.store.sqlite)).toBe(digest);
  });

  it('serves its own names and origins', async () => {
    for (const name of [`127.0.0.1:${port}`, `localhost:${port}`]) {
      expect((await send({ path: '/', host: name })).status, name).toBe(200);
    }
    for (const origin of [`http://127.0.0.1:${port}`, `http://localhost:${port}`]) {
      expect((await post('/api/homes.list', '{}', withToken({ origin }))).status).toBe(200);
    }
  });

  it('answers a CORS preflight without allowing anything', async () => {
    const preflight = {
      'access-control-request-method': 'POST',
      'access-control-request-headers': `${TOKEN_HEADER}, content-type`,
    };
    const own = { ...preflight, origin: `http://127.0.0.1:${port}` };
    const options = (headers: Record<string, string>) =>
      send({ method: 'OPTIONS', path: '/api/homes.list', headers });
    expect((await options({ ...preflight, origin: 'http://evil.example' })).status).toBe(403);
    expect((await options(own)).status).toBe(401);
    expect((await options({ ...own, [TOKEN_HEADER]: host.token })).status).toBe(405);
  });
});

describe('the channels over HTTP', () => {
  it('lists the homes with the right token and Host, as the table does in-process', async () => {
    const reply = await post('/api/homes.list', '{}');
    expect(reply.status).toBe(200);
    expect(reply.headers['content-type']).toMatch(/^application\/json/);
    const expected = callChannel(project.context, 'homes.list', {});
    expect(JSON.parse(reply.body)).toEqual(expected);
    expect(expected.ok && expected.value.some((home) => home.isDemo)).toBe(true);
    expect(JSON.parse((await post('/api/homes.list', '')).body)).toEqual(expected);
  });

  it('writes with the right token, so the unchanged digests above are refusals', async () => {
    const digest = projectDigest(project.store.sqlite);
    const reply = JSON.parse((await post('/api/homes.create', createBody())).body) as {
      ok: boolean;
      value: { id: number };
    };
    expect(reply.ok).toBe(true);
    expect(projectDigest(project.store.sqlite)).not.toBe(digest);
    const stored = callChannel(project.context, 'homes.get', { id: reply.value.id });
    expect(stored.ok && stored.value.home.name).toBe(baseHomeInput(null).name);
  });

  it('allows only POST on /api/ (405)', async () => {
    for (const path of ['/api/homes.list', '/api/']) {
      for (const method of ['GET', 'PUT', 'DELETE', 'PATCH']) {
        const reply = await send({ method, path, headers: withToken() });
        expect(reply.status, `${method} ${path}`).toBe(405);
      }
    }
    expect((await send({ method: 'POST', path: '/', body: '{}' })).status).toBe(405);
  });

  it('answers 404 for a name that is not a channel', async () => {
    const names = [
      'nope',
      '__proto__',
      'constructor',
      'toString',
      'homes.list/x',
      '',
      '%68omes.list',
    ];
    for (const name of names) {
      const reply = await post(`/api/${name}`, '{}');
      expect(reply.status, name).toBe(404);
      expect(JSON.parse(reply.body), name).toMatchObject({
        ok: false,
        error: { kind: 'notFound' },
      });
    }
  });

  it('refuses a body over MAX_BODY_BYTES (413) and writes nothing', async () => {
    const digest = projectDigest(project.store.sqlite);
    const request = createBody();
    const padded = request + ' '.repeat(MAX_BODY_BYTES + 1 - Buffer.byteLength(request));
    const reply = await post('/api/homes.create', padded);
    expect(reply.status).toBe(413);
    expect(JSON.parse(reply.body)).toMatchObject({ ok: false, error: { kind: 'invalid' } });
    // One byte less is a body like any other.
    const list = await post('/api/homes.list', `{}${' '.repeat(MAX_BODY_BYTES - 2)}`);
    expect(list.status).toBe(200);
    // Sent in chunks with no declared length, the host cuts the connection (see below).
    const chunks = [Buffer.from(padded.slice(0, 1_000_000)), Buffer.from(padded.slice(1_000_000))];
    await httpRequest({
      port,
      method: 'POST',
      path: '/api/homes.create',
      headers: withToken(),
      chunks,
    }).then(
      (chunked) => expect(chunked.status).toBe(413),
      (error: unknown) => expect(String(error)).toMatch(/hang up|ECONNRESET|EPIPE/),
    );
    expect(projectDigest(project.store.sqlite)).toBe(digest);
  });

  // Regression check (once a bug in electron/serve.ts, readBody): a chunked body that passes the limit calls
  // `request.destroy()`, which destroys the socket before the 413 reply is written, so the
  // client sees a reset instead of 413. Nothing is written (checked above). Expected to fail
  // until the host stops reading and answers 413 with `Connection: close` before closing.
  it('answers 413 to an oversized chunked body', async () => {
    const chunks = [Buffer.alloc(MAX_BODY_BYTES / 2, 32), Buffer.alloc(MAX_BODY_BYTES / 2 + 1, 32)];
    const reply = await httpRequest({
      port,
      method: 'POST',
      path: '/api/homes.list',
      headers: withToken(),
      chunks,
    });
    expect(reply.status).toBe(413);
  });

  it('answers 400 to a body that is not JSON, and writes nothing', async () => {
    const digest = projectDigest(project.store.sqlite);
    for (const body of [
      '{',
      '{"name":',
      "{'name':'x'}",
      'undefined',
      'NaN',
      '{"a":1}}',
      '\u0000',
    ]) {
      const reply = await post('/api/homes.create', body);
      expect(reply.status, body).toBe(400);
      expect(JSON.parse(reply.body)).toMatchObject({ ok: false, error: { kind: 'invalid' } });
    }
    // JSON that parses but is not the channel's request: the table's own refusal.
    for (const body of ['null', '[]', '"text"', '{"name":"x","data":{},"__proto__":{}}']) {
      const reply = await post('/api/homes.create', body);
      expect(reply.status, body).toBe(200);
      expect(JSON.parse(reply.body), body).toMatchObject({ ok: false, error: { kind: 'invalid' } });
    }
    expect(projectDigest(project.store.sqlite)).toBe(digest);
  });
});

describe('the larger body of photos.add', () => {
  const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');
  const homeIdOf = () => {
    const homes = callChannel(project.context, 'homes.list', {});
    const id = homes.ok ? homes.value[0]?.id : undefined;
    if (id === undefined) throw new Error('the project has no home');
    return id;
  };
  const photoBody = (homeId: number, photo: Buffer) =>
    JSON.stringify({ homeId, kind: 'before', base64: photo.toString('base64') });

  it('leaves room for the largest photo the store takes, as base64 in JSON', () => {
    // Base64 writes every 3 bytes as 4 characters, the last group padded (RFC 4648 §4); the
    // rest of the request (homeId, kind, caption of at most 500 characters, each at most a
    // 6-character JSON escape) is well under the 2 MiB that stays for it.
    const largestBase64Chars = 4 * Math.ceil(MAX_PHOTO_BYTES / 3);
    const restOfRequestChars = 200 + 500 * 6;
    expect(MAX_PHOTO_BODY_BYTES).toBeGreaterThanOrEqual(largestBase64Chars + restOfRequestChars);
    expect(MAX_PHOTO_BODY_BYTES - largestBase64Chars).toBe(MAX_BODY_BYTES);
  });

  it('takes a photo past the small limit, byte for byte, and only on that channel', async () => {
    const homeId = homeIdOf();
    // 900 × 900 RGB pixels that do not compress: about 2.4 MB, 3.2 MB as base64.
    const photo = pngImage(900, 900, 7);
    const body = photoBody(homeId, photo);
    expect(Buffer.byteLength(body)).toBeGreaterThan(MAX_BODY_BYTES);
    const reply = await post('/api/photos.add', body);
    expect(reply.status).toBe(200);
    const added = JSON.parse(reply.body) as { ok: boolean; value: { id: number; sha256: string } };
    expect(added, reply.body.slice(0, 300)).toMatchObject({ ok: true });
    expect(added.value.sha256).toBe(sha256(photo));
    const stored = callChannel(project.context, 'photos.get', { id: added.value.id });
    expect(stored.ok && Buffer.from(stored.value.base64, 'base64').equals(photo)).toBe(true);

    // A body of the same size to any other channel is still too large.
    const digest = projectDigest(project.store.sqlite);
    const request = createBody();
    const padded = request + ' '.repeat(Buffer.byteLength(body) - Buffer.byteLength(request));
    for (const name of ['homes.create', 'homes.list', 'photos.list']) {
      const other = await post(`/api/${name}`, padded);
      expect(other.status, name).toBe(413);
    }
    expect(projectDigest(project.store.sqlite)).toBe(digest);
  });

  it('refuses a photos.add body past its own limit (413), writing nothing', async () => {
    const digest = projectDigest(project.store.sqlite);
    const small = photoBody(homeIdOf(), pngImage(4, 4, 3));
    const over = small + ' '.repeat(MAX_PHOTO_BODY_BYTES + 1 - Buffer.byteLength(small));
    const refused = await post('/api/photos.add', over);
    expect(refused.status).toBe(413);
    expect(JSON.parse(refused.body)).toMatchObject({ ok: false, error: { kind: 'invalid' } });
    expect(projectDigest(project.store.sqlite)).toBe(digest);
  }, 60_000);

  it('takes the largest photo the store takes, byte for byte', async () => {
    const homeId = homeIdOf();
    // 2280 × 2290 RGB pixels: just under the store's 15 MiB once deflated (they do not compress).
    const photo = pngImage(2280, 2290, 11);
    expect(photo.length).toBeLessThanOrEqual(MAX_PHOTO_BYTES);
    expect(photo.length).toBeGreaterThan(MAX_PHOTO_BYTES * 0.99);
    const reply = await post('/api/photos.add', photoBody(homeId, photo));
    expect(reply.status).toBe(200);
    const added = JSON.parse(reply.body) as { ok: boolean; value: { sha256: string } };
    expect(added.ok && added.value.sha256).toBe(sha256(photo));
  }, 60_000);
});

describe('the screens’ files', () => {
  it('serves index.html and other files of the folder', async () => {
    const index = await send({ path: '/' });
    expect(index.status).toBe(200);
    expect(index.headers['content-type']).toMatch(/^text\/html/);
    expect(index.body).toContain(INDEX_MARKER);
    expect((await send({ path: '/app.js' })).headers['content-type']).toMatch(/^text\/javascript/);
    const head = await send({ method: 'HEAD', path: '/index.html' });
    expect([head.status, head.body]).toEqual([200, '']);
    expect((await send({ path: '/missing.html' })).status).toBe(404);
  });

  it('never serves a file outside the folder, however the path is written', async () => {
    const paths = [
      '/../package.json',
      '/%2e%2e/package.json',
      '/%2E%2E/package.json',
      '/..%2fpackage.json',
      '/%2e%2e%2fpackage.json',
      '/..%5cpackage.json',
      '/ui/../../package.json',
      '/./../secret.txt',
      '//../secret.txt',
      '/....//secret.txt',
      '/%252e%252e/secret.txt',
      '/%2e%2e/%2e%2e/%2e%2e/%2e%2e/etc/passwd',
      '/..;/secret.txt',
      '/%00/../secret.txt',
      `/${'../'.repeat(12)}etc/passwd`,
    ];
    for (const path of paths) {
      const reply = await send({ path });
      expect(reply.status, path).toBe(404);
      expect(reply.body, path).not.toContain(SECRET);
    }
  });

  // Regression check (once a bug in electron/serve.ts, staticFile): `decodeURIComponent` throws on a malformed escape
  // such as `%E0%A4%A`; the error reaches the catch-all and the host answers 500 (with its
  // security headers, nothing served). A bad path is the client's fault: expected 400 or
  // 404. Expected to fail until staticFile treats an undecodable path as not found.
  it('answers a path with a malformed escape as a bad or missing file', async () => {
    const reply = await send({ path: '/%E0%A4%A' });
    expect([400, 404]).toContain(reply.status);
  });
});
