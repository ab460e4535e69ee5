/** Query keys of the intake feature: all → labels / pack. */
export const intakeKeys = {
  all: ['intake'] as const,
  labels: (swapId: number, maker: string) => [...intakeKeys.all, 'labels', swapId, maker] as const,
  pack: (swapId: number) => [...intakeKeys.all, 'pack', swapId] as const,
};
