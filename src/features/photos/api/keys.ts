/** What a photo belongs to; trays have photos too, but the germination pages handle those. */
export type PhotoSubject = 'lot' | 'plant';

/** Query keys of photos, under the bank's own prefix ['banks', bankId]. */
export const photoKeys = {
  all: (bankId: string) => ['banks', bankId, 'photos'] as const,
  ofSubject: (bankId: string, subject: PhotoSubject, subjectId: string) =>
    [...photoKeys.all(bankId), subject, subjectId] as const,
};

const bankPath = (bankId: string) => `/api/banks/${encodeURIComponent(bankId)}`;
export const photoApiPaths = {
  ofSubject: (bankId: string, subject: PhotoSubject, subjectId: string) =>
    `${bankPath(bankId)}/${subject === 'lot' ? 'lots' : 'plants'}/${encodeURIComponent(subjectId)}/photos`,
  photo: (bankId: string, photoId: string) => `${bankPath(bankId)}/photos/${encodeURIComponent(photoId)}`,
};
