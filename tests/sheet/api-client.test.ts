import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiError, apiErrorOf, apiFetch } from '@/lib/api-client';

// The typed client against a real local HTTP server answering in the contract's shapes
// ({"error": {"code", "message", "field"?}}; CONTRACT.md, API).
describe('apiFetch', () => {
  let server: Server;
  let base = '';
  const seen: { method?: string; type?: string; body?: string }[] = [];

  beforeAll(async () => {
    server = createServer((req, res) => {
      let body = '';
      req.on('data', (chunk) => (body += chunk));
      req.on('end', () => {
        seen.push({ method: req.method, type: req.headers['content-type'], body });
        if (req.url === '/ok') return res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify({ items: [1, 2], total: 2 }));
        if (req.url === '/bad') {
          return res.writeHead(400, { 'content-type': 'application/json' }).end(JSON.stringify({ error: { code: 'validation', message: 'title: too long', field: 'title' } }));
        }
        if (req.url === '/conflict') {
          return res.writeHead(409, { 'content-type': 'application/json' }).end(JSON.stringify({ error: { code: 'conflict', message: 'Someone saved first.' }, current: { number: 3 } }));
        }
        if (req.url === '/html') return res.writeHead(502, { 'content-type': 'text/html' }).end('<h1>Bad gateway</h1>');
        res.writeHead(204).end();
      });
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  });
  afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

  it('should return the typed JSON answer and send a body as JSON with POST', async () => {
    const answer = await apiFetch<{ items: number[]; total: number }>(`${base}/ok`, { body: { name: 'x' } });
    expect(answer.total).toBe(2);
    expect(seen.at(-1)).toEqual({ method: 'POST', type: 'application/json', body: '{"name":"x"}' });
    await apiFetch(`${base}/ok`);
    expect(seen.at(-1)?.method).toBe('GET');
  });

  it('should throw one ApiError with status, code, message and field from the contract shape', async () => {
    const error = await apiFetch(`${base}/bad`, { method: 'PUT', body: {} }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 400, code: 'validation', message: 'title: too long', field: 'title' });
  });

  it('should keep the rest of the body (what is current on a 409)', async () => {
    const error = (await apiFetch(`${base}/conflict`, { body: {} }).catch((e: unknown) => e)) as ApiError;
    expect(error.status).toBe(409);
    expect((error.body as { current: { number: number } }).current.number).toBe(3);
  });

  it('should still throw an ApiError for an answer that is not JSON, and for an unreachable server', async () => {
    const html = (await apiFetch(`${base}/html`).catch((e: unknown) => e)) as ApiError;
    expect(html).toMatchObject({ status: 502, code: 'error', message: 'The server answered 502.' });
    const down = (await apiFetch('http://127.0.0.1:9/nothing').catch((e: unknown) => e)) as ApiError;
    expect(down).toMatchObject({ status: 0, code: 'network' });
  });

  it('should answer null for an empty 204', async () => {
    expect(await apiFetch(`${base}/empty`, { method: 'DELETE' })).toBeNull();
  });

  it('should rebuild errors without a body', () => {
    expect(apiErrorOf(500, null)).toMatchObject({ status: 500, code: 'error' });
  });
});
