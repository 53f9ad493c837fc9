/** What a photo belongs to: a lot's packet, a parent plant, or a tray of a germination test. */
export type PhotoSubject = 'lot' | 'plant' | 'tray';

/**
 * A tray is found through its test (…/tests/:testId/trays/:trayId/photos), so a tray's subject id
 * names both: "<testId>/<trayId>" (ids are UUIDs, which hold no slash).
 */
export const traySubjectId = (testId: string, trayId: string) => `${testId}/${trayId}`;

/** Query keys of photos, under the bank's own prefix ['banks', bankId]. */
export const photoKeys = {
  all: (bankId: string) => ['banks', bankId, 'photos'] as const,
  ofSubject: (bankId: string, subject: PhotoSubject, subjectId: string) =>
    [...photoKeys.all(bankId), subject, subjectId] as const,
};

const bankPath = (bankId: string) => `/api/banks/${encodeURIComponent(bankId)}`;
export const photoApiPaths = {
  ofSubject: (bankId: string, subject: PhotoSubject, subjectId: string) => {
    if (subject === 'tray') {
      const [testId = '', trayId = ''] = subjectId.split('/');
      return `${bankPath(bankId)}/tests/${encodeURIComponent(testId)}/trays/${encodeURIComponent(trayId)}/photos`;
    }
    return `${bankPath(bankId)}/${subject === 'lot' ? 'lots' : 'plants'}/${encodeURIComponent(subjectId)}/photos`;
  },
  photo: (bankId: string, photoId: string) => `${bankPath(bankId)}/photos/${encodeURIComponent(photoId)}`,
};
