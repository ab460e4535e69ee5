/**
 * clientId idempotency for block requests sent by offline tools: the first answer is stored in the
 * same transaction as the change, and a repeat with the same clientId gets that answer back without
 * changing anything. A failed request stores nothing, so it may be retried with the same id.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import { BlockRequest } from '../db/models';
import { ConflictError } from '../http/errors';
import type { AppDeps } from '../deps';

export interface Outcome<T> {
  status: number;
  body: T;
  /** work to do after commit (domain events); skipped on a replay */
  after?: () => void;
}

export interface Answer<T> {
  status: number;
  body: T;
  replayed: boolean;
}

interface Claim {
  clientId?: string;
  userId: number;
  blockId: number;
  action: string;
}

export async function idempotent<T>(
  deps: Pick<AppDeps, 'sequelize'>,
  claim: Claim,
  run: (transaction: Transaction) => Promise<Outcome<T>>,
): Promise<Answer<T>> {
  const { sequelize } = deps;
  const { clientId } = claim;
  const result = await sequelize.transaction(async (transaction): Promise<Outcome<T> & { replayed: boolean }> => {
    if (clientId) {
      // A concurrent request with the same id waits here until the first one commits or rolls back.
      const claimed = await sequelize.query(
        `INSERT INTO block_requests (client_id, user_id, block_id, action, created_at)
         VALUES ($clientId, $userId, $blockId, $action, now()) ON CONFLICT (client_id) DO NOTHING RETURNING client_id`,
        {
          bind: { clientId, userId: claim.userId, blockId: claim.blockId, action: claim.action },
          type: QueryTypes.SELECT,
          transaction,
        },
      );
      if (claimed.length === 0) {
        const prior = await BlockRequest.findByPk(clientId, { transaction });
        if (!prior || prior.blockId !== claim.blockId || prior.action !== claim.action || prior.userId !== claim.userId) {
          throw new ConflictError('This clientId was already used for a different request; send a new one.', 'client_id_reused');
        }
        return { status: prior.statusCode ?? 200, body: prior.response as T, replayed: true };
      }
    }
    const outcome = await run(transaction);
    if (clientId) {
      await BlockRequest.update(
        { statusCode: outcome.status, response: outcome.body as object },
        { where: { clientId }, transaction },
      );
    }
    return { ...outcome, replayed: false };
  });
  if (!result.replayed) result.after?.();
  return { status: result.status, body: result.body, replayed: result.replayed };
}
