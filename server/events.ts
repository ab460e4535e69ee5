import { EventEmitter } from 'node:events';
import type { Role } from '@shared/schemas/guilds';
import type { BlockState, Verdict } from '@shared/vocabulary';
import type { ChatMessageDto } from '@shared/schemas/chat';

type SwapRef = { swapId: number; guildId: number };
type Actor = { actorId: number };

/**
 * In-process domain events, emitted by services after their transaction commits. The live board and
 * the mail jobs subscribe here, so the services that change data know nothing about either.
 */
export interface DomainEventMap {
  'member.joined': { guildId: number; userId: number; role: Role };
  'member.removed': { guildId: number; userId: number };
  'swap.created': SwapRef & Actor;
  'swap.updated': SwapRef & Actor;
  'swap.transitioned': SwapRef & Actor & { from: string; to: string };
  'signup.changed': SwapRef & Actor & { userId: number; blocks: number };
  'signup.withdrawn': SwapRef & Actor & { userId: number };
  /** sewn, handed in, received, trimmed, returned: any change of a block's state or recipient. */
  'block.changed': SwapRef & Actor & { blockId: number; makerId: number; from: BlockState; to: BlockState };
  'block.measured': SwapRef &
    Actor & { blockId: number; makerId: number; measurementId: number; verdict: Verdict; source: 'ruler' | 'maker' | 'photo' };
  'photo.added': SwapRef & Actor & { blockId: number; makerId: number; photoId: number };
  /** A photo estimate of a block's size was saved; it never changes the block's ruler verdict. */
  'block.estimated': SwapRef &
    Actor & { blockId: number; makerId: number; estimateId: number; photoId: number; verdict: Verdict };
  'distribution.confirmed': SwapRef & Actor & { transfers: number };
  /** Sew days: scheduled, changed or cancelled by an officer; an RSVP given or changed. */
  'sewday.changed': { guildId: number; sewDayId: number; actorId: number; change: 'scheduled' | 'updated' | 'cancelled' };
  'rsvp.changed': { guildId: number; sewDayId: number; userId: number; answer: 'going' | 'maybe' | 'no' };
  /** Chat: a message as it now stands (new, edited, deleted by its author or removed by a moderator). */
  'chat.posted': { guildId: number; roomId: number; actorId: number; message: ChatMessageDto };
  'chat.changed': {
    guildId: number;
    roomId: number;
    actorId: number;
    change: 'edited' | 'deleted' | 'removed';
    message: ChatMessageDto;
  };
  /** Sign-in sessions that ended (signed out, or every session of an account after a password reset or change). */
  'session.ended': { userId: number; sessionIds: string[] };
  /** The account's name, units or address changed: sessions that carry its old fields are read again. */
  'account.changed': { userId: number };
  /** Someone asked for an account; the mail job looks the address up (never the request, so it answers alike). */
  'account.signup-requested': { pendingSignupId: number };
  /** Someone asked for a password reset link; the mail job looks the address up. */
  'account.reset-requested': { email: string };
  /** Payments changed by a verified webhook: paid or refunded (receipts), or failed. */
  'payment.settled': {
    guildId: number;
    userId: number;
    swapId: number | null;
    paymentIds: number[];
    status: 'paid' | 'refunded' | 'failed';
  };
}

export type DomainEventName = keyof DomainEventMap;

export class DomainEvents {
  private emitter = new EventEmitter();

  constructor() {
    this.emitter.setMaxListeners(50);
  }

  emit<K extends DomainEventName>(name: K, payload: DomainEventMap[K]) {
    this.emitter.emit(name, payload);
    this.emitter.emit('*', name, payload);
  }

  on<K extends DomainEventName>(name: K, listener: (payload: DomainEventMap[K]) => void | Promise<void>) {
    this.emitter.on(name, (payload: DomainEventMap[K]) => this.guard(name, () => listener(payload)));
  }

  /** Every event, for subscribers that fan them all out (the live board). */
  onAny(listener: (name: DomainEventName, payload: DomainEventMap[DomainEventName]) => void | Promise<void>) {
    this.emitter.on('*', (name: DomainEventName, payload: DomainEventMap[DomainEventName]) =>
      this.guard(name, () => listener(name, payload)),
    );
  }

  onListenerError(handler: (info: { name: string; error: unknown }) => void) {
    this.emitter.on('listener-error', handler);
  }

  // A listener's failure must never undo or fail the request that emitted the event.
  private guard(name: string, run: () => void | Promise<void>) {
    Promise.resolve()
      .then(run)
      .catch((error: unknown) => this.emitter.emit('listener-error', { name, error }));
  }
}
