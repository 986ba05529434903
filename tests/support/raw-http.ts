// Raw HTTP for the API suites: any method (TRACE, PROPFIND), any body and content type, chunked
// bodies, headers fetch would not send. Answers are read whole, with the body parsed when it is JSON.
import http from 'node:http';
import { appUrl } from './http';

/** Bodies above this (with a Content-Length) wait for an early refusal before they are sent. */
const LARGE_BODY_BYTES = 1024 * 1024;

export type RawAnswer = { status: number; headers: http.IncomingHttpHeaders; text: string; body: any };

export function rawRequest(options: {
  method: string;
  path: string;
  headers?: Record<string, string>;
  body?: string | Buffer;
  chunked?: boolean;
  base?: string;
}): Promise<RawAnswer> {
  const url = new URL(options.path, options.base ?? appUrl());
  const body = options.body === undefined ? undefined : Buffer.isBuffer(options.body) ? options.body : Buffer.from(options.body, 'utf8');
  const headers: Record<string, string> = { ...options.headers };
  if (body !== undefined && !options.chunked) headers['content-length'] = String(body.length);
  return new Promise((resolve, reject) => {
    const request = http.request(
      { host: url.hostname, port: url.port, method: options.method, path: `${url.pathname}${url.search}`, headers, agent: false },
      (response) => {
        const chunks: Buffer[] = [];
        response.on('data', (chunk: Buffer) => chunks.push(chunk));
        response.on('end', () => {
          const text = Buffer.concat(chunks).toString('utf8');
          let parsed: unknown = null;
          try {
            parsed = text ? JSON.parse(text) : null;
          } catch {
            parsed = null;
          }
          resolve({ status: response.statusCode ?? 0, headers: response.headers, text, body: parsed });
          request.destroy(); // a body never sent leaves the connection open
        });
        response.on('error', reject);
      },
    );
    request.on('error', reject);
    if (body !== undefined && !options.chunked && body.length > LARGE_BODY_BYTES) {
      // As a client that sends `Expect: 100-continue` may (RFC 9110 §10.1.1): send the headers, and give the server
      // a moment to refuse the body by its declared length before sending it. A server that answers 413 and
      // closes while a large body is still being written makes the write fail (EPIPE) and the answer unreadable.
      request.flushHeaders();
      let answered = false;
      request.once('response', () => {
        answered = true;
      });
      setTimeout(() => {
        if (answered) return;
        request.write(body);
        request.end();
      }, 1000);
      return;
    }
    if (body !== undefined) {
      if (options.chunked) {
        // Several chunks of at most 64 kB, without a Content-Length.
        for (let offset = 0; offset < body.length; offset += 65536) request.write(body.subarray(offset, offset + 65536));
      } else request.write(body);
    }
    request.end();
  });
}
