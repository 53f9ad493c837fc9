import crypto from 'node:crypto';
import { Readable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type TestContext } from '../helpers/context';

const sha = (b: Buffer) => crypto.createHash('sha256').update(b).digest('hex');

describe('the object-store adapter', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
  });
  afterAll(() => ctx.close());

  it('when a buffer is put, then it reads back byte-identical', async () => {
    const body = crypto.randomBytes(200_000);
    const key = `test/${crypto.randomUUID()}.bin`;
    await ctx.storage.put(key, body, 'application/octet-stream');
    const back = await ctx.storage.getBuffer(key);
    expect(back && sha(back)).toBe(sha(body));
  });

  it('when a stream of unknown length is put, then it reads back byte-identical', async () => {
    // 7 MB in uneven chunks: more than one multipart part (5 MiB), so framing bugs would show.
    const chunks = Array.from({ length: 7 }, (_, i) => crypto.randomBytes(1_000_000 + i * 37));
    const whole = Buffer.concat(chunks);
    const key = `test/${crypto.randomUUID()}.bin`;
    await ctx.storage.put(key, Readable.from(chunks), 'application/octet-stream');
    const back = await ctx.storage.getBuffer(key);
    expect(back?.length).toBe(whole.length);
    expect(back && sha(back)).toBe(sha(whole));
  });

  it('when an object is deleted, then reading it gives null', async () => {
    const key = `test/${crypto.randomUUID()}.txt`;
    await ctx.storage.put(key, Buffer.from('seed'), 'text/plain');
    await ctx.storage.delete(key);
    expect(await ctx.storage.get(key)).toBeNull();
  });
});
