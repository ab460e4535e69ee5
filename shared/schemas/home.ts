/** The home screen: what is next for the signed-in person, across every guild they belong to. */
import { z } from 'zod';
import { idParam } from './ids';
import type { RsvpAnswer } from './sewdays';

export const roomSeenParamsSchema = z.object({ roomId: idParam }).strict();
/** Nothing to send: the time is the server's. */
export const roomSeenBodySchema = z.object({}).strict();

interface InGuild {
  guildId: number;
  guildName: string;
  /** the guild's IANA time zone, for dates shown */
  timeZone: string;
}

export interface OwedSwap extends InGuild {
  swapId: number;
  swapTitle: string;
  dueAt: string;
  /** blocks still to hand in: pledged (to sew) or sewn (to hand in) */
  blocks: { id: number; sequence: number; state: 'pledged' | 'sewn' }[];
}

export interface OpenSwap extends InGuild {
  swapId: number;
  swapTitle: string;
  signupClosesAt: string;
  /** blocks the person pledged, or null when not signed up */
  pledged: number | null;
}

export interface NextSewDay extends InGuild {
  sewDayId: number;
  title: string;
  startsAt: string;
  endsAt: string;
  answer: RsvpAnswer | null;
}

export interface ComingBack extends InGuild {
  swapId: number;
  swapTitle: string;
  count: number;
}

export interface UnreadRoom extends InGuild {
  roomId: number;
  kind: 'sewday' | 'swap';
  /** the sew day or swap the room belongs to */
  ownerId: number;
  title: string;
  unread: number;
}

export interface OfficerSwap extends InGuild {
  swapId: number;
  swapTitle: string;
  count: number;
  dueAt: string;
}

export interface NextForMeDto {
  blocksOwed: OwedSwap[];
  openSwaps: OpenSwap[];
  sewDays: NextSewDay[];
  comingBack: ComingBack[];
  unreadRooms: UnreadRoom[];
  /** only for guilds where the person is a coordinator or admin */
  officer: { toReceive: OfficerSwap[]; overdue: OfficerSwap[] };
}
