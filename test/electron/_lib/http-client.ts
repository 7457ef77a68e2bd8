/**
 * A bare HTTP client for the browser host tests: node:http with every header under the
 * test's control (the Host header too, and the path sent exactly as written, `..` and
 * percent escapes included), no connection reuse, and a raw-socket variant for requests
 * node:http will not form (HTTP/1.0 without a Host header).
 */
import { request, type IncomingHttpHeaders } from 'node:http';
import { connect } from 'node:net';

/** What came back. */
export interface HttpReply {
  status: number;
  headers: IncomingHttpHeaders;
  body: string;
}

/** One request to the host on 127.0.0.1. */
export interface HttpCall {
  port: number;
  method?: string;
  /** Sent as is. */
  path: string;
  /** The Host header; defaults to the host's own `127.0.0.1:PORT`. */
  host?: string;
  headers?: Readonly<Record<string, string | readonly string[]>>;
  body?: string | Buffer;
  /** Sends the body in these pieces with chunked transfer encoding (no Content-Length). */
  chunks?: readonly Buffer[];
  /** The address to connect to (default 127.0.0.1). */
  address?: string;
}

/**
 * Sends one HTTP/1.1 request and reads the whole reply.
 *
 * @param call - what to send
 * @returns the status, headers and body (UTF-8); rejects when the connection fails or is cut
 */
export function httpRequest(call: HttpCall): Promise<HttpReply> {
  return new Promise((resolve, reject) => {
    const headers: Record<string, string | string[]> = {
      host: call.host ?? `127.0.0.1:${call.port}`,
      connection: 'close',
    };
    for (const [name, value] of Object.entries(call.headers ?? {})) {
      headers[name] = typeof value === 'string' ? value : [...value];
    }
    if (call.chunks) headers['transfer-encoding'] = 'chunked';
    const outgoing = request(
      {
        host: call.address ?? '127.0.0.1',
        port: call.port,
        method: call.method ?? 'GET',
        path: call.path,
        headers,
        setHost: false,
        agent: false,
      },
      (incoming) => {
        const pieces: Buffer[] = [];
        incoming.on('data', (piece: Buffer) => pieces.push(piece));
        incoming.on('end', () =>
          resolve({
            status: incoming.statusCode ?? 0,
            headers: incoming.headers,
            body: Buffer.concat(pieces).toString('utf8'),
          }),
        );
        incoming.on('error', reject);
      },
    );
    outgoing.on('error', reject);
    if (call.chunks) {
      for (const piece of call.chunks) outgoing.write(piece);
      outgoing.end();
    } else {
      outgoing.end(call.body);
    }
  });
}

/**
 * Writes raw bytes to the port and reads until the server closes (ask for that with
 * HTTP/1.0 or `Connection: close`).
 *
 * @param port - the host's port on 127.0.0.1
 * @param text - the whole request, CRLFs included
 * @returns everything the server sent
 */
export function rawHttp(port: number, text: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const socket = connect(port, '127.0.0.1', () => socket.write(text));
    let received = '';
    socket.setEncoding('utf8');
    socket.on('data', (piece: string) => (received += piece));
    socket.on('end', () => resolve(received));
    socket.on('error', reject);
  });
}
