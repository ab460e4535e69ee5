/**
 * clientId idempotency for block requests sent by offline tools: the first answer is stored in the
 * same transaction as the change, and a repeat with the same clientId gets that answer back without
 * changing anything. A failed request stores nothing, so it may be retried with the same id.
 *
 * The route's policy has already locked the block, so repeats on one block queue there; the answer
 * is stored last, and a repeat finds the id taken, undoes its own change and answers as the first did.
 */
import type { Sequelize, Transaction } from 'sequelize';
import { BlockRequest } from '../db/models';
import { ConflictError } from '../http/errors';
import type { Reply } from '../http/route';
import { storeAnswer } from './blocks.queries';

export interface Claim {
  clientId?: string;
  userId: number;
  blockId: number;
  action: string;
}

/** A request with a clientId did not change anything: its answer may be stored already. */
class ClaimedRequestUndone extends Error {
  constructor(
    readonly claim: Claim & { clientId: string },
    readonly failure?: unknown,
  ) {
    super('request with a clientId undone');
  }
}

/** Runs the change and stores its answer under the clientId, in the route's transaction. */
export async function idempotent<T>(
  db: Sequelize,
  transaction: Transaction,
  claim: Claim,
  run: () => Promise<Reply<T> & { status: number }>,
): Promise<Reply<T>> {
  const { clientId } = claim;
  if (!clientId) return run();
  let reply: Reply<T> & { status: number };
  try {
    reply = await run();
  } catch (failure) {
    // It may have failed only because the first request with this id already did the work.
    throw new ClaimedRequestUndone({ ...claim, clientId }, failure);
  }
  const stored = await storeAnswer(db, transaction, { ...claim, clientId, status: reply.status, response: reply.body });
  if (!stored) throw new ClaimedRequestUndone({ ...claim, clientId });
  return reply;
}

/**
 * After the rollback of a request with a clientId: the stored answer when the same request was
 * answered before; otherwise the request's own failure.
 */
export async function answerAsBefore(error: unknown): Promise<Reply> {
  if (!(error instanceof ClaimedRequestUndone)) throw error;
  return priorAnswer(error.claim, error.failure);
}

/**
 * The stored answer of the request first sent with `claim`'s clientId, for a repeat that changed
 * nothing; otherwise the repeat's own `failure` (or, without one, a request still being answered).
 */
export async function priorAnswer(claim: Claim & { clientId: string }, failure?: unknown): Promise<Reply> {
  const prior = await BlockRequest.findByPk(claim.clientId);
  if (!prior) {
    if (failure) throw failure;
    throw new ConflictError('This request is being answered already; send it again in a moment.', 'client_id_busy');
  }
  if (prior.blockId !== claim.blockId || prior.action !== claim.action || prior.userId !== claim.userId) {
    throw new ConflictError('This clientId was already used for a different request; send a new one.', 'client_id_reused');
  }
  return { status: prior.statusCode ?? 200, body: prior.response, headers: { 'Idempotent-Replay': 'true' } };
}
