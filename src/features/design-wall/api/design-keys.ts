/** Query keys of the design wall. */
export const designKeys = {
  all: ['design-wall'] as const,
  detail: (swapId: number) => [...designKeys.all, 'design', swapId] as const,
};
