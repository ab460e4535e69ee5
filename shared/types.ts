import type { Role } from './schemas/guilds';
import type { Units } from './schemas/auth';

export interface UserDto {
  id: number;
  email: string;
  displayName: string;
  units: Units;
}

export interface MembershipDto {
  guildId: number;
  guildName: string;
  role: Role;
  /** the guild's default unit, which applies to the person there until they choose one of their own */
  defaultUnit: Units;
}

export interface MeDto {
  /** unitsChosen: false while the person follows each guild's default unit */
  user: UserDto & { mailingAddress: string | null; unitsChosen: boolean };
  memberships: MembershipDto[];
}

export interface GuildDto {
  id: number;
  name: string;
  timeZone: string;
  /** ISO 4217, lower case: the currency of the guild's dues and swap fees. */
  currency: string;
  /** Yearly dues in the currency's minor unit, or null when the guild asks for none. */
  dues: { amount: number; year: number } | null;
  /** what a bare number means for members who have not chosen a unit of their own */
  defaultUnit: Units;
  /** who sees the verdicts on other makers' blocks (makers always see their own) */
  verdictsVisibleTo: 'officers' | 'guild';
  createdAt: string;
  myRole: Role;
  memberCount: number;
}

export interface MemberDto {
  userId: number;
  displayName: string;
  email: string;
  role: Role;
  joinedAt: string;
}

export interface InvitationDto {
  id: number;
  email: string;
  role: Role;
  /** Anyone with the link may accept it, not only the account with this address. */
  open: boolean;
  expiresAt: string;
  acceptedAt: string | null;
}

/** How many invitations may still be sent today, by the caller and by the whole guild. */
export interface InvitationLimitsDto {
  perInviterDay: number;
  perGuildDay: number;
  sentByYouToday: number;
  sentByGuildToday: number;
  /** What the caller may still send now: the smaller of the two allowances left. */
  remaining: number;
  validDays: number;
}

export interface InvitationPreviewDto {
  guildName: string;
  email: string;
  role: Role;
  open: boolean;
  expiresAt: string;
}
