export const liveBoardKeys = {
  all: ['live-board'] as const,
  board: (swapId: number) => [...liveBoardKeys.all, swapId] as const,
  roster: (swapId: number) => [...liveBoardKeys.board(swapId), 'roster'] as const,
  activity: (swapId: number) => [...liveBoardKeys.board(swapId), 'activity'] as const,
  presence: (swapId: number) => [...liveBoardKeys.board(swapId), 'presence'] as const,
};
