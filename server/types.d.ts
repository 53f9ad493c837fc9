import type { Role } from './db/schema';

declare global {
  namespace Express {
    interface Request {
      /** Set by the session middleware when a valid session cookie came with the request. */
      auth?: { userId: string; sessionId: string };
      /** Set by the bank access middleware on /api/banks/:bankId/… routes. */
      bank?: { id: string; role: Role };
    }
  }
}

export {};
