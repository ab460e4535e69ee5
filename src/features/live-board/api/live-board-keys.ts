/** Query keys of the live board's own data (its roster is the shared `rosterKeys` one). */
export const liveBoardKeys = {
  all: ['live-board'] as const,
  board: (swapId: number) => [...liveBoardKeys.all, swapId] as const,
  activity: (swapId: number) => [...liveBoardKeys.board(swapId), 'activity'] as const,
  presence: (swapId: number) => [...liveBoardKeys.board(swapId), 'presence'] as const,
};
