export type SewDayWhen = 'upcoming' | 'past';

export const sewDayKeys = {
  all: ['sew-days'] as const,
  lists: (guildId: number) => [...sewDayKeys.all, 'list', guildId] as const,
  list: (guildId: number, when: SewDayWhen) => [...sewDayKeys.lists(guildId), when] as const,
  detail: (sewDayId: number) => [...sewDayKeys.all, 'detail', sewDayId] as const,
};
