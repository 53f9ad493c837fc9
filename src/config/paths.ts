/*
 * Every client route in one place. Pages link through `getHref()`, so when the bank areas move
 * under `/banks/:bankId/…` only this file and the router change.
 */
export const paths = {
  home: { path: '/', getHref: () => '/' },
  overview: { path: '/overview', getHref: () => '/overview' },
  lots: { path: '/lots', getHref: () => '/lots' },
  planner: { path: '/planner', getHref: () => '/planner' },
  members: { path: '/members', getHref: () => '/members' },
  settings: { path: '/settings', getHref: () => '/settings' },
  devMail: {
    path: '/dev/mail',
    getHref: (messageId?: string) =>
      messageId === undefined ? '/dev/mail' : `/dev/mail?message=${encodeURIComponent(messageId)}`,
  },
} as const;

/** The areas of a bank that the main navigation lists, in order. */
export type BankArea = 'overview' | 'lots' | 'planner' | 'members' | 'settings';
