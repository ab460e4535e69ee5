/** Query keys of the signed-in person. Signing in or out clears every query except these. */
export const meKeys = {
  all: ['auth'] as const,
  me: () => [...meKeys.all, 'me'] as const,
};
