// The role matrix: every route of a bank, the least role it needs, and a request that exercises
// it. Later issues add their routes here; tests/api/roles.test.ts runs each one as owner,
// grower, viewer, a signed-in non-member and an anonymous caller.
import type { Role } from '../../server/db/schema';

export interface MatrixFixture {
  bankId: string;
  /** Ids of records made fresh for each call, so a destructive route has something to act on. */
  make(kind: 'member' | 'invitation'): Promise<string>;
}

export interface MatrixRoute {
  method: 'get' | 'post' | 'patch' | 'delete';
  path: (f: MatrixFixture) => string | Promise<string>;
  body?: (f: MatrixFixture) => object;
  least: Role;
  /** The status a caller with enough role gets (defaults to any 2xx). */
  ok?: number;
  /** Where a role allowed to call the route still gets a business answer (e.g. last owner 409). */
  overrides?: Partial<Record<Role, number>>;
  /** Routes that end the bank or the caller's membership run last, on a bank of their own. */
  destructive?: boolean;
}

export const bankRoutes: Record<string, MatrixRoute> = {
  'GET bank': { method: 'get', path: (f) => `/api/banks/${f.bankId}`, least: 'viewer' },
  'PATCH bank': {
    method: 'patch',
    path: (f) => `/api/banks/${f.bankId}`,
    body: () => ({ lastFrost: '05-21' }),
    least: 'owner',
  },
  'GET members': { method: 'get', path: (f) => `/api/banks/${f.bankId}/members`, least: 'viewer' },
  'PATCH member': {
    method: 'patch',
    path: async (f) => `/api/banks/${f.bankId}/members/${await f.make('member')}`,
    body: () => ({ role: 'grower' }),
    least: 'owner',
  },
  'DELETE member': {
    method: 'delete',
    path: async (f) => `/api/banks/${f.bankId}/members/${await f.make('member')}`,
    least: 'owner',
    ok: 204,
  },
  'GET invitations': { method: 'get', path: (f) => `/api/banks/${f.bankId}/invitations`, least: 'owner' },
  'POST invitation': {
    method: 'post',
    path: (f) => `/api/banks/${f.bankId}/invitations`,
    body: () => ({ email: `invitee-${Math.random().toString(36).slice(2)}@example.org`, role: 'viewer' }),
    least: 'owner',
    ok: 201,
  },
  'DELETE invitation': {
    method: 'delete',
    path: async (f) => `/api/banks/${f.bankId}/invitations/${await f.make('invitation')}`,
    least: 'owner',
    ok: 204,
  },
  'POST leave': {
    method: 'post',
    path: (f) => `/api/banks/${f.bankId}/leave`,
    least: 'viewer',
    ok: 204,
    // The fixture's owner is the bank's only owner, who may not leave it (API.md: 409).
    overrides: { owner: 409 },
    destructive: true,
  },
  'DELETE bank': { method: 'delete', path: (f) => `/api/banks/${f.bankId}`, least: 'owner', ok: 204, destructive: true },
};
