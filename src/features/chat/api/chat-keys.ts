export const chatKeys = {
  all: ['chat'] as const,
  room: (roomId: number) => [...chatKeys.all, 'room', roomId] as const,
  messages: (roomId: number) => [...chatKeys.room(roomId), 'messages'] as const,
  presence: (roomId: number) => [...chatKeys.room(roomId), 'presence'] as const,
  swapRoom: (swapId: number) => [...chatKeys.all, 'swap', swapId] as const,
};
