/**
 * HTTP requests that fetch cannot make: a body streamed without Content-Length that may never end,
 * and headers fetch will not send (Host). The answer is read as soon as the server gives it, even
 * while the body is still being sent.
 */
import http from 'node:http';
import { APP_URL } from './http';

export interface RawAnswer {
  status: number;
  headers: http.IncomingHttpHeaders;
  text: string;
  /** Bytes of the request body written before the answer came. */
  sent: number;
  json<T = { error: { code: string; message: string; fields?: Record<string, string[]> } }>(): T;
}

export interface RawRequest {
  method?: string;
  path: string;
  headers?: Record<string, string>;
  /** A fixed body, sent with its Content-Length. */
  body?: string | Buffer;
  /** Send this many bytes of `fill` in 64 KiB chunks, without Content-Length. */
  stream?: { bytes: number; fill?: string; endless?: boolean };
  timeoutMs?: number;
}

export function raw(req: RawRequest): Promise<RawAnswer> {
  const url = new URL(req.path, APP_URL);
  return new Promise((resolve, reject) => {
    let sent = 0;
    let answered = false;
    const headers: Record<string, string> = { ...req.headers };
    if (req.body !== undefined && !req.stream) headers['content-length'] = String(Buffer.byteLength(req.body));
    // Node frames a streamed body as chunks by itself only for some methods (not DELETE).
    if (req.stream) headers['transfer-encoding'] = 'chunked';
    // Keep-alive, as browsers send it: a client that asks for "Connection: close" (agent: false) gets
    // its socket closed right after the answer, and a reset if it is still sending.
    const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
    const request = http.request(
      { host: url.hostname, port: url.port, path: url.pathname + url.search, method: req.method ?? 'POST', headers, agent },
      (res) => {
        answered = true;
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => {
          clearTimeout(timer);
          const text = Buffer.concat(chunks).toString('utf8');
          resolve({ status: res.statusCode ?? 0, headers: res.headers, text, sent, json: () => JSON.parse(text) });
          request.destroy();
          agent.destroy();
        });
      },
    );
    const timer = setTimeout(() => {
      request.destroy();
      agent.destroy();
      reject(new Error(`No answer within ${req.timeoutMs ?? 20_000} ms to ${req.method ?? 'POST'} ${req.path} (${sent} bytes sent)`));
    }, req.timeoutMs ?? 20_000);
    // The server may close the connection once it has answered; that is not a failure here.
    request.on('error', (err) => {
      if (!answered) {
        clearTimeout(timer);
        agent.destroy();
        reject(err);
      }
    });
    if (req.stream) {
      const chunk = Buffer.alloc(64 * 1024, req.stream.fill ?? ' ');
      const { bytes, endless } = req.stream;
      const pump = () => {
        while (!answered && !request.destroyed && sent < bytes) {
          sent += chunk.length;
          if (!request.write(chunk)) return void request.once('drain', pump);
        }
        // An endless body is left open: only a server that stops reading at its limit answers.
        if (!endless && !answered && !request.destroyed) request.end();
      };
      pump();
    } else {
      request.end(req.body);
    }
  });
}
