/** A swap as the mail templates show it: sizes in the reader's units, dates in the guild's zone. */
import type { Units } from '@shared/schemas/auth';
import { blockKindLabels } from '@shared/schemas/blocks';
import type { Guild, Swap } from '../../db/models';
import { daysUntil, inDays, mailDate, mailLength, mailSize, zoneLabel } from '../format';

export interface SwapView {
  title: string;
  description: string | null;
  kindLabel: string;
  finished: string;
  unfinished: string;
  seam: string;
  tolerance: string;
  squareness: string;
  colourRules: { role: string; note: string }[];
  quota: string;
  signupCloses: string;
  signupClosesIn: string;
  due: string;
  dueIn: string;
  zone: string;
  mode: string;
}

function quotaText(min: number, max: number) {
  if (min === max) return `${min} block${min === 1 ? '' : 's'} each`;
  return `${min} to ${max} blocks each, your choice`;
}

/** Everything about a swap a member needs to decide and to sew. */
export function swapView(swap: Swap, guild: Guild, units: Units, now = new Date(), giftName: string | null = null): SwapView {
  const tz = guild.timeZone;
  return {
    title: swap.title,
    description: swap.description?.trim() ? swap.description.trim() : null,
    kindLabel: blockKindLabels[swap.blockSpec.kind],
    finished: mailSize({ width: swap.finishedWidth, height: swap.finishedHeight }, units),
    unfinished: mailSize({ width: swap.unfinishedWidth, height: swap.unfinishedHeight }, units),
    seam: mailLength(swap.seam, units),
    tolerance: `${mailLength(swap.tolerance, units)} either way`,
    squareness: mailLength(swap.squareness, units),
    colourRules: (swap.colourRules ?? []).map((r) => ({ role: r.role, note: r.note || 'your choice' })),
    quota: quotaText(swap.quotaMin, swap.quotaMax),
    signupCloses: mailDate(swap.signupClosesAt, tz),
    signupClosesIn: inDays(daysUntil(swap.signupClosesAt, now, tz)),
    due: mailDate(swap.dueAt, tz),
    dueIn: inDays(daysUntil(swap.dueAt, now, tz)),
    zone: zoneLabel(tz),
    mode:
      swap.mode === 'gift'
        ? `Every block goes to ${giftName ?? swap.giftRecipientName ?? 'one recipient'} as a gift.`
        : 'Each maker gets back, from other members, as many blocks as they handed in that passed the size check.',
  };
}
