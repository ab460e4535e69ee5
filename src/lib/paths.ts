/** Every page URL in one place. */
export const paths = {
  home: '/',
  signIn: '/sign-in',
  register: '/register',
  forgotPassword: '/forgot-password',
  resetPassword: '/reset-password',
  confirmEmail: '/confirm-email',
  invitation: (token = ':token') => `/invitations/${token}`,
  guilds: '/guilds',
  guild: (guildId: number | string = ':guildId') => `/guilds/${guildId}`,
  members: (guildId: number | string = ':guildId') => `/guilds/${guildId}/members`,
  planner: '/planner',
  about: (guildId: number | string = ':guildId') => `/guilds/${guildId}/about`,
  newSwap: (guildId: number | string = ':guildId') => `/guilds/${guildId}/swaps/new`,
  swap: (guildId: number | string = ':guildId', swapId: number | string = ':swapId') => `/guilds/${guildId}/swaps/${swapId}`,
  editSwap: (guildId: number | string = ':guildId', swapId: number | string = ':swapId') =>
    `/guilds/${guildId}/swaps/${swapId}/edit`,
  swapRoster: (guildId: number | string = ':guildId', swapId: number | string = ':swapId') =>
    `/guilds/${guildId}/swaps/${swapId}/roster`,
  swapReturn: (guildId: number | string = ':guildId', swapId: number | string = ':swapId') =>
    `/guilds/${guildId}/swaps/${swapId}/return`,
  swapSheet: (guildId: number | string = ':guildId', swapId: number | string = ':swapId') =>
    `/guilds/${guildId}/swaps/${swapId}/sheet`,
  swapDesign: (guildId: number | string = ':guildId', swapId: number | string = ':swapId') =>
    `/guilds/${guildId}/swaps/${swapId}/design`,
  sewDays: (guildId: number | string = ':guildId') => `/guilds/${guildId}/sew-days`,
  newSewDay: (guildId: number | string = ':guildId') => `/guilds/${guildId}/sew-days/new`,
  sewDay: (guildId: number | string = ':guildId', sewDayId: number | string = ':sewDayId') =>
    `/guilds/${guildId}/sew-days/${sewDayId}`,
  editSewDay: (guildId: number | string = ':guildId', sewDayId: number | string = ':sewDayId') =>
    `/guilds/${guildId}/sew-days/${sewDayId}/edit`,
  swapBoard: (guildId: number | string = ':guildId', swapId: number | string = ':swapId') =>
    `/guilds/${guildId}/swaps/${swapId}/board`,
  swapChat: (guildId: number | string = ':guildId', swapId: number | string = ':swapId') =>
    `/guilds/${guildId}/swaps/${swapId}/chat`,
  swapIntake: (guildId: number | string = ':guildId', swapId: number | string = ':swapId') =>
    `/guilds/${guildId}/swaps/${swapId}/intake`,
  swapLabels: (guildId: number | string = ':guildId', swapId: number | string = ':swapId') =>
    `/guilds/${guildId}/swaps/${swapId}/labels`,
  photoMeasure: (
    guildId: number | string = ':guildId',
    swapId: number | string = ':swapId',
    blockId: number | string = ':blockId',
    photoId: number | string = ':photoId',
  ) => `/guilds/${guildId}/swaps/${swapId}/blocks/${blockId}/photos/${photoId}/measure`,
  settings: '/settings',
  mailPreferences: '/settings/email',
  unsubscribe: '/unsubscribe',
  mailLog: (guildId: number | string = ':guildId') => `/guilds/${guildId}/mail`,
  guildDues: (guildId: number | string = ':guildId') => `/guilds/${guildId}/dues`,
  guildPayments: (guildId: number | string = ':guildId') => `/guilds/${guildId}/payments`,
  swapFees: (guildId: number | string = ':guildId', swapId: number | string = ':swapId') =>
    `/guilds/${guildId}/swaps/${swapId}/fees`,
  myPayments: '/settings/payments',
  paymentReturn: '/payments/return',
} as const;

/** Where to go after signing in: only same-site paths are followed. */
export function safeNext(next: string | null | undefined): string {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : paths.guilds;
}
