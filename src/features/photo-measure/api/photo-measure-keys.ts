export const photoMeasureKeys = {
  all: ['photo-measure'] as const,
  block: (blockId: number) => [...photoMeasureKeys.all, 'block', blockId] as const,
  estimates: (blockId: number) => [...photoMeasureKeys.block(blockId), 'estimates'] as const,
};
