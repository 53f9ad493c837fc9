// Compressed answers and caching headers: the built client's hashed files are sent in the build's
// brotli or gzip copies with a year's immutable cache, index.html must be revalidated, and the
// API's JSON is compressed only for clients that ask for it and decompresses to the same bytes.
// Content codings: RFC 9110 §8.4.1 (br: RFC 7932, gzip: RFC 1952); `immutable`: RFC 8246.
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import zlib from 'node:zlib';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PASSWORD, uniqueEmail } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';

interface RawAnswer {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: Buffer;
}

/** One request with exactly these headers, its body as the bytes on the wire (no decoding). */
function raw(
  base: string,
  pathname: string,
  headers: Record<string, string>,
  options: { method?: string; body?: string } = {},
): Promise<RawAnswer> {
  return new Promise((resolve, reject) => {
    const req = http.request(`${base}${pathname}`, { method: options.method ?? 'GET', headers }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () =>
        resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks) }),
      );
      res.on('error', reject);
    });
    req.on('error', reject);
    req.end(options.body);
  });
}

function decode(answer: RawAnswer): Buffer {
  const coding = answer.headers['content-encoding'];
  if (coding === 'br') return zlib.brotliDecompressSync(answer.body);
  if (coding === 'gzip') return zlib.gunzipSync(answer.body);
  return answer.body;
}

const IMMUTABLE = 'public, max-age=31536000, immutable';

describe('compression and caching', () => {
  let ctx: TestContext;
  let server: http.Server;
  let base: string;
  /** The entry script that the built index.html loads, e.g. /assets/index-AbC123.js. */
  let entry: string;
  let entryBytes: Buffer;

  beforeAll(async () => {
    ctx = await createTestContext();
    const html = fs.readFileSync(path.join(ctx.config.staticDir, 'index.html'), 'utf8');
    entry = /<script[^>]+src="(\/assets\/[^"]+\.js)"/.exec(html)![1]!;
    entryBytes = fs.readFileSync(path.join(ctx.config.staticDir, entry));
    server = ctx.app.listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  });
  afterAll(async () => {
    server.closeAllConnections();
    await new Promise((resolve) => server.close(resolve));
    await ctx.close();
  });

  it('when a client accepts brotli, then a hashed script comes as brotli, immutable, same bytes', async () => {
    const res = await raw(base, entry, { 'accept-encoding': 'gzip, deflate, br' });
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['cache-control']).toBe(IMMUTABLE);
    expect(res.headers.vary).toMatch(/accept-encoding/i);
    expect(res.headers['content-type']).toMatch(/javascript/);
    expect(res.body.length).toBeLessThan(entryBytes.length / 2);
    expect(decode(res).equals(entryBytes)).toBe(true);
  });

  it('when a client accepts only gzip, then the hashed script comes gzipped, immutable, same bytes', async () => {
    const res = await raw(base, entry, { 'accept-encoding': 'gzip' });
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.headers['cache-control']).toBe(IMMUTABLE);
    expect(decode(res).equals(entryBytes)).toBe(true);
  });

  it('when a client asks for no compression, then the hashed script comes as it is, immutable', async () => {
    const res = await raw(base, entry, {});
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBeUndefined();
    expect(res.headers['cache-control']).toBe(IMMUTABLE);
    expect(res.body.equals(entryBytes)).toBe(true);
  });

  // A script needs nosniff and a same-origin resource policy (Fetch standard, "X-Content-Type-Options"
  // and CORP); the content security policy and frame rules apply to documents (CSP Level 3, HTML).
  it('when a hashed script is fetched, then it carries only the headers a script needs; a page keeps its policy', async () => {
    for (const headers of [{ 'accept-encoding': 'br' }, {}] as Record<string, string>[]) {
      const res = await raw(base, entry, headers);
      expect(res.status).toBe(200);
      expect(res.headers['x-content-type-options']).toBe('nosniff');
      expect(res.headers['cross-origin-resource-policy']).toBe('same-origin');
      for (const name of [
        'content-security-policy',
        'x-frame-options',
        'etag',
        'last-modified',
        'accept-ranges',
      ])
        expect(res.headers[name]).toBeUndefined();
    }
    const page = await raw(base, '/banks/anything/lots', { 'accept-encoding': 'br' });
    expect(page.headers['content-security-policy']).toContain("default-src 'self'");
    expect(page.headers['x-content-type-options']).toBe('nosniff');
    const missing = await raw(base, '/assets/no-such-file-AbC123.js', { 'accept-encoding': 'br' });
    expect(missing.headers['content-security-policy']).toContain("default-src 'self'");
  });

  it('when index.html or another unhashed file is fetched, then it must be revalidated (no-cache)', async () => {
    for (const pathname of ['/', '/banks/anything/lots']) {
      const res = await raw(base, pathname, { 'accept-encoding': 'br, gzip' });
      expect(res.status).toBe(200);
      expect(res.headers['cache-control']).toBe('no-cache');
      expect(decode(res).toString('utf8')).toContain(entry);
    }
    const favicon = await raw(base, '/favicon.svg', { 'accept-encoding': 'br, gzip' });
    expect(favicon.status).toBe(200);
    expect(favicon.headers['cache-control']).toBe('no-cache');
  });

  it('when the API is asked for compressed JSON, then it compresses it, and not when it is not asked', async () => {
    const signUp = await request(ctx.app)
      .post('/api/auth/register')
      .send({ email: uniqueEmail(), password: PASSWORD, name: 'Grower' });
    expect(signUp.status).toBe(201);
    const cookie = String(signUp.headers['set-cookie']![0]).split(';')[0]!;

    // A write, answered through the read cache's and the request log's wrappers.
    const created = await raw(
      base,
      '/api/banks',
      { cookie, 'content-type': 'application/json', 'accept-encoding': 'br' },
      { method: 'POST', body: JSON.stringify({ name: 'Shed circle', lastFrost: '05-20' }) },
    );
    expect(created.status).toBe(201);
    const bankId = (JSON.parse(decode(created).toString('utf8')) as { bank: { id: string } }).bank.id;

    // The reference species: several KB of JSON, well past the 1 KB threshold.
    const url = `/api/banks/${bankId}/species`;
    const plain = await raw(base, url, { cookie });
    const br = await raw(base, url, { cookie, 'accept-encoding': 'br' });
    const gzip = await raw(base, url, { cookie, 'accept-encoding': 'gzip' });
    expect([plain.status, br.status, gzip.status]).toEqual([200, 200, 200]);
    expect(plain.body.length).toBeGreaterThan(1024);
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.headers.vary).toMatch(/accept-encoding/i);
    expect(br.headers['content-encoding']).toBe('br');
    expect(gzip.headers['content-encoding']).toBe('gzip');
    expect(br.body.length).toBeLessThan(plain.body.length);
    expect(gzip.body.length).toBeLessThan(plain.body.length);
    expect(decode(br).equals(plain.body)).toBe(true);
    expect(decode(gzip).equals(plain.body)).toBe(true);
    expect(JSON.parse(plain.body.toString('utf8'))).toBeTruthy();
  });
});
