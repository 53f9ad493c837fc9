import { bankKeys } from '#src/lib/bank-api';

const id = encodeURIComponent;

/** The API paths of offers between banks (server/openapi/routes.ts documents them). */
export const offerPaths = {
  lotOffers: (bankId: string, lotId: string) => `/api/banks/${id(bankId)}/lots/${id(lotId)}/offers`,
  lotOffer: (bankId: string, lotId: string, offerId: string) =>
    `/api/banks/${id(bankId)}/lots/${id(lotId)}/offers/${id(offerId)}`,
  received: (bankId: string, lotId: string) => `/api/banks/${id(bankId)}/lots/${id(lotId)}/received`,
  circle: () => '/api/offers',
  offer: (offerId: string, token?: string) =>
    `/api/offers/${id(offerId)}${token ? `?token=${id(token)}` : ''}`,
  accept: (offerId: string) => `/api/offers/${id(offerId)}/accept`,
  decline: (offerId: string) => `/api/offers/${id(offerId)}/decline`,
  requests: (offerId: string) => `/api/offers/${id(offerId)}/requests`,
};

/** Query keys: a lot's offers and how it was received sit under the lot, so its refreshes reach them. */
export const offerKeys = {
  /** Everything across banks: the circle's list and single offers. */
  all: ['offers'] as const,
  circle: () => [...offerKeys.all, 'circle'] as const,
  offer: (offerId: string) => [...offerKeys.all, offerId] as const,
  lotOffers: (bankId: string, lotId: string) => [...bankKeys.lot(bankId, lotId), 'offers'] as const,
  received: (bankId: string, lotId: string) => [...bankKeys.lot(bankId, lotId), 'received'] as const,
};
