/** Query keys of guilds: all → lists / detail → members / invitations. A guild's swaps are under `swapKeys.list`. */
export const guildKeys = {
  all: ['guilds'] as const,
  lists: () => [...guildKeys.all, 'list'] as const,
  detail: (guildId: number) => [...guildKeys.all, 'detail', guildId] as const,
  members: (guildId: number) => [...guildKeys.detail(guildId), 'members'] as const,
  invitations: (guildId: number) => [...guildKeys.detail(guildId), 'invitations'] as const,
  invitationPreview: (token: string) => [...guildKeys.all, 'invitation', token] as const,
};
