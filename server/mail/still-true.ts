/**
 * The check every queued swap message passes just before it is sent: the message is drafted again
 * from the swap as it stands now. Nothing to say any more (the swap moved on, the deadline passed,
 * the member owes nothing) drops it; a different key means newer news has its own message, so this
 * one is dropped too; the same key with other words (a date now "tomorrow", a replacement no longer
 * asked for) rewrites it. Account mail and the digest are sent as recorded.
 */
import type { Drafted, DraftDeps } from './compose/context';
import { announcementDraft } from './compose/announcement';
import { signupConfirmationDraft } from './compose/signup-confirmation';
import { reminderDraft } from './compose/reminders';
import { receiptDraft } from './compose/receipt';
import { distributionDrafts } from './compose/distribution';
import type { RenderedMail } from './render';

interface QueuedMessage {
  kind: string;
  swap_id: number | null;
  user_id: number | null;
  idempotency_key: string;
  subject: string;
  text_body: string;
}

type StillTrue = { send: 'as-recorded' } | { send: 'rewritten'; mail: RenderedMail } | { drop: string };

/** Why a message of this kind has nothing left to say, in words for the mail log. */
const gone: Record<string, string> = {
  'swap-announcement': 'Not sent: sign-up had closed (or the swap moved on) before it went out.',
  'signup-confirmation': 'Not sent: the pledge changed or was withdrawn before it went out.',
  'signup-reminder': 'Not sent: the reminder no longer applied when it was due to go out.',
  'due-reminder': 'Not sent: the reminder no longer applied when it was due to go out.',
  receipt: 'Not sent: no block of this maker was in hand any more.',
  distribution: 'Not sent: the return had changed before it went out.',
};

async function draftNow(deps: DraftDeps, m: QueuedMessage, now: Date): Promise<Drafted | null | undefined> {
  const { config } = deps;
  const swapId = m.swap_id;
  const userId = m.user_id;
  if (swapId === null || userId === null) return undefined;
  switch (m.kind) {
    case 'swap-announcement':
      return announcementDraft(config, swapId, userId, now);
    case 'signup-confirmation':
      return signupConfirmationDraft(config, swapId, userId, now);
    case 'signup-reminder':
      return reminderDraft(deps, swapId, userId, 'signup', now);
    case 'due-reminder':
      return reminderDraft(deps, swapId, userId, 'due', now);
    case 'receipt':
      return (await receiptDraft(config, swapId, userId, now))?.drafted ?? null;
    case 'distribution': {
      const drafts = await distributionDrafts(deps, swapId, userId);
      const r = drafts?.recipients[0];
      return drafts && r ? drafts.draft(r) : null;
    }
    default:
      return undefined;
  }
}

/** Whether a queued message still says what is true now, and what to send if so. */
export async function stillTrue(deps: DraftDeps, message: QueuedMessage, now = new Date()): Promise<StillTrue> {
  const fresh = await draftNow(deps, message, now);
  if (fresh === undefined) return { send: 'as-recorded' };
  if (fresh === null) return { drop: gone[message.kind] ?? 'Not sent: it no longer applied.' };
  if (fresh.key !== message.idempotency_key) return { drop: 'Not sent: newer news replaced it, in its own message.' };
  if (fresh.mail.subject === message.subject && fresh.mail.text === message.text_body) return { send: 'as-recorded' };
  return { send: 'rewritten', mail: fresh.mail };
}
