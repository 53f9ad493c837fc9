/** Query keys of the signed-in person, from the broadest down (invalidate by prefix). */
export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
};
