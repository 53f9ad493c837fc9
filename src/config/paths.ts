/*
 * Every client route in one place. Pages link through `getHref()`, so a route can move by
 * changing only this file and the router.
 */

/** `?next=` for the sign-in and sign-up pages, left off when there is nowhere to go back to. */
function withNext(path: string, next?: string): string {
  return next ? `${path}?next=${encodeURIComponent(next)}` : path;
}

const bankHref = (bankId: string, area: string) => `/banks/${encodeURIComponent(bankId)}/${area}`;

export const paths = {
  home: { path: '/', getHref: () => '/' },
  signIn: { path: '/sign-in', getHref: (next?: string) => withNext('/sign-in', next) },
  signUp: { path: '/sign-up', getHref: (next?: string) => withNext('/sign-up', next) },
  forgotPassword: { path: '/forgot-password', getHref: () => '/forgot-password' },
  resetPassword: { path: '/reset-password', getHref: () => '/reset-password' },
  verifyEmail: {
    path: '/verify-email',
    getHref: (token: string) => `/verify-email?token=${encodeURIComponent(token)}`,
  },
  acceptInvitation: {
    path: '/invitations/accept',
    getHref: (token: string) => `/invitations/accept?token=${encodeURIComponent(token)}`,
  },
  newBank: { path: '/banks/new', getHref: () => '/banks/new' },
  bank: { path: '/banks/:bankId', getHref: (bankId: string) => `/banks/${encodeURIComponent(bankId)}` },
  overview: { path: 'overview', getHref: (bankId: string) => bankHref(bankId, 'overview') },
  lots: { path: 'lots', getHref: (bankId: string) => bankHref(bankId, 'lots') },
  newLot: { path: 'lots/new', getHref: (bankId: string) => bankHref(bankId, 'lots/new') },
  importLots: { path: 'lots/import', getHref: (bankId: string) => bankHref(bankId, 'lots/import') },
  lot: {
    path: 'lots/:lotId',
    getHref: (bankId: string, lotId: string) => bankHref(bankId, `lots/${encodeURIComponent(lotId)}`),
  },
  plants: { path: 'plants', getHref: (bankId: string) => bankHref(bankId, 'plants') },
  labels: {
    path: 'labels',
    /** The printable sheet of packet labels for the given lots (ids joined by commas). */
    getHref: (bankId: string, lotIds: readonly string[] = [], paper?: 'a4' | 'letter', giving = false) => {
      const query = [
        lotIds.length ? `lots=${lotIds.map(encodeURIComponent).join(',')}` : '',
        paper ? `paper=${paper}` : '',
        // Packets for giving seed away.
        giving ? 'for=giving' : '',
      ].filter(Boolean);
      return bankHref(bankId, `labels${query.length ? `?${query.join('&')}` : ''}`);
    },
  },
  newAssay: {
    path: 'lots/:lotId/tests/new',
    getHref: (bankId: string, lotId: string) =>
      bankHref(bankId, `lots/${encodeURIComponent(lotId)}/tests/new`),
  },
  assay: {
    path: 'tests/:testId',
    getHref: (bankId: string, assayId: string) => bankHref(bankId, `tests/${encodeURIComponent(assayId)}`),
  },
  planner: { path: 'planner', getHref: (bankId: string) => bankHref(bankId, 'planner') },
  reminders: { path: 'reminders', getHref: (bankId: string) => bankHref(bankId, 'reminders') },
  members: { path: 'members', getHref: (bankId: string) => bankHref(bankId, 'members') },
  settings: { path: 'settings', getHref: (bankId: string) => bankHref(bankId, 'settings') },
  // Offers between banks.
  offers: { path: 'offers', getHref: (bankId: string) => bankHref(bankId, 'offers') },
  offer: {
    path: '/offers/:offerId',
    getHref: (offerId: string, token?: string) =>
      `/offers/${encodeURIComponent(offerId)}${token ? `?token=${encodeURIComponent(token)}` : ''}`,
  },
  devMail: {
    path: '/dev/mail',
    getHref: (messageId?: string) =>
      messageId === undefined ? '/dev/mail' : `/dev/mail?message=${encodeURIComponent(messageId)}`,
  },
} as const;

/** The areas of a bank that the main navigation lists, in order. */
export type BankArea = 'overview' | 'lots' | 'planner' | 'members' | 'settings';
export const bankAreas: readonly BankArea[] = ['overview', 'lots', 'planner', 'members', 'settings'];
