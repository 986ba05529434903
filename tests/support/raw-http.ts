// Raw HTTP for the API suites: any method (TRACE, PROPFIND), any body and content type, chunked
// bodies, headers fetch would not send. Answers are read whole, with the body parsed when it is JSON.
import http from 'node:http';
import { appUrl } from './http';

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
        });
        response.on('error', reject);
      },
    );
    request.on('error', (error: NodeJS.ErrnoException) => {
      // The server may answer 413 and close before a large body is fully sent.
      if (error.code === 'EPIPE' || error.code === 'ECONNRESET') reject(error);
      else reject(error);
    });
    if (body !== undefined) {
      if (options.chunked) {
        // Several chunks of at most 64 kB, without a Content-Length.
        for (let offset = 0; offset < body.length; offset += 65536) request.write(body.subarray(offset, offset + 65536));
      } else request.write(body);
    }
    request.end();
  });
}
