import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type TestContext } from '../helpers/context';
import { waitForMail } from '../helpers/outbox';

describe('mail through the SMTP fake', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
  });
  afterAll(() => ctx.close());

  it('when the mailer sends a message, then it arrives in the outbox as a parseable .eml', async () => {
    const subject = `Tray check ${crypto.randomUUID()}`;
    await ctx.mailer.send({ to: 'grower@example.org', subject, text: 'Count tray 2 today — ünïcode kept.' });
    const mail = await waitForMail((m) => m.subject === subject);
    const file = path.join(ctx.config.outboxDir, `${mail.id}.eml`);
    const parsed = await simpleParser(fs.readFileSync(file));
    expect(parsed.subject).toBe(subject);
    expect(parsed.text?.trim()).toBe('Count tray 2 today — ünïcode kept.');
    expect(mail.to).toEqual(['grower@example.org']);
  });

  it('when mail was captured, then GET /dev/outbox lists it outside production', async () => {
    const subject = `Listed ${crypto.randomUUID()}`;
    await ctx.mailer.send({ to: 'viewer@example.org', subject, text: 'hello' });
    await waitForMail((m) => m.subject === subject);
    const res = await request(ctx.app).get('/dev/outbox');
    expect(res.status).toBe(200);
    expect(res.body.items.some((m: { subject: string }) => m.subject === subject)).toBe(true);
  });
});
