import crypto from 'node:crypto';
import type { Express } from 'express';
import request from 'supertest';
import type { Db } from '#server/db/database';

export const PASSWORD = 'correct horse battery';

export function uniqueEmail(prefix = 'grower'): string {
  return `${prefix}-${crypto.randomBytes(4).toString('hex')}@example.org`;
}

/** Registers a new person and returns a cookie-keeping agent signed in as them. */
export async function signUp(app: Express, options: { email?: string; name?: string } = {}) {
  const agent = request.agent(app);
  const email = options.email ?? uniqueEmail();
  const res = await agent
    .post('/api/auth/register')
    .send({ email, password: PASSWORD, name: options.name ?? 'Test Grower' });
  if (res.status !== 201) throw new Error(`sign-up failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { agent, user: res.body.user as { id: string; email: string; name: string }, email };
}

export async function signIn(app: Express, email: string, password = PASSWORD) {
  const agent = request.agent(app);
  const res = await agent.post('/api/auth/login').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
  return agent;
}

/**
 * A bank with an owner, a grower, a viewer and a signed-in outsider, each with an agent. Members
 * are added straight into the table (the invitation flow has tests of its own).
 */
export async function bankWithRoles(app: Express, db: Db) {
  const owner = await signUp(app, { name: 'Owner' });
  const grower = await signUp(app, { name: 'Grower' });
  const viewer = await signUp(app, { name: 'Viewer' });
  const outsider = await signUp(app, { name: 'Outsider' });
  const created = await owner.agent.post('/api/banks').send({ name: 'Test circle', lastFrost: '05-20' });
  const bankId = created.body.bank.id as string;
  await db
    .insertInto('memberships')
    .values([
      { bank_id: bankId, user_id: grower.user.id, role: 'grower' },
      { bank_id: bankId, user_id: viewer.user.id, role: 'viewer' },
    ])
    .execute();
  return { bankId, owner, grower, viewer, outsider };
}
