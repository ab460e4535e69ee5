/**
 * The measuring station's working state: which block is on the table, the last verdict, and the
 * recent blocks. A scan or typed code is matched (by the server when it answers, else against the
 * copy kept on the device), queued as `received`, and the measurement queued after it; the verdict
 * shows at once from the same engine the server uses, and is marked confirmed when the server's arrives.
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { classifyIntakeInput, formatShortCode } from '@shared/block-reference';
import { checkBlock } from '@shared/quilt';
import type { IntakeBlockDto } from '@shared/schemas/intake';
import type { VerdictName } from '@shared/swap-types';
import { isBlockStateBefore } from '@shared/vocabulary';
import { ApiError } from '@/lib/api-client';
import { newClientId } from '@/lib/client-id';
import { resolveBlock } from '../api/resolve-block';
import { intakeKeys } from '../api/intake-keys';
import type { IntakePack } from '../api/get-intake-pack';
import type { MeasurementSend } from '@/entities/block/api/measure-block';
import { enqueue, savePack } from '../offline/intake-db';
import { flushQueue, notifyQueueChanged, onSent } from '../offline/sync-queue';
import { pickNewer } from '../offline/pick-newer';

export interface StationResult {
  clientId: string;
  block: IntakeBlockDto;
  measured: MeasurementSend;
  local: { verdict: VerdictName; deviations: { width: number; height: number; diagonal?: number } };
  /** the server's verdict once the measurement has reached it */
  confirmed: VerdictName | null;
}

const RESOLVE_TIMEOUT_MS = 4000;
const RECENT = 12;

export const blockLabel = (b: IntakeBlockDto) => `Block ${b.ordinal} of ${b.of} · ${b.maker.displayName}`;

export function useIntakeStation(pack: IntakePack, userId: number) {
  const queryClient = useQueryClient();
  const swapId = pack.swap.id;
  const [current, setCurrent] = useState<IntakeBlockDto | null>(null);
  const [results, setResults] = useState<StationResult[]>([]);
  const [codeError, setCodeError] = useState<string | null>(null);
  const [resolving, setResolving] = useState(false);
  const packRef = useRef(pack);
  useEffect(() => {
    packRef.current = pack;
  }, [pack]);

  /** Writes a block's new state into the pack, in the query cache and on the device. */
  const patchBlock = useCallback(
    (blockId: number, patch: Partial<IntakeBlockDto>) => {
      const next = queryClient.setQueryData<IntakePack>(intakeKeys.pack(swapId), (old) =>
        old ? { ...old, blocks: old.blocks.map((b) => (b.id === blockId ? { ...b, ...patch } : b)) } : old,
      );
      if (next) void savePack(next);
    },
    [queryClient, swapId],
  );

  useEffect(
    () =>
      onSent((event) => {
        if (event.item.swapId !== swapId) return;
        if (event.kind === 'measure') {
          const { verdict, block } = event.answer;
          setResults((rs) => rs.map((r) => (r.clientId === event.item.clientId ? { ...r, confirmed: verdict } : r)));
          patchBlock(block.id, { state: block.state, verdict: block.verdict });
        } else if (event.answer) {
          patchBlock(event.answer.id, { state: event.answer.state });
        }
      }),
    [swapId, patchBlock],
  );

  const findLocally = (text: string): { block?: IntakeBlockDto; error?: string } => {
    const input = classifyIntakeInput(text);
    if (input.kind === 'invalid') return { error: input.message };
    const blocks = packRef.current.blocks;
    if (input.kind === 'reference') {
      if (input.parsed.swapId !== swapId) return { error: 'This label is for another swap; it cannot be taken in here.' };
      // The pack holds every reference the server signed for this swap: an exact match is a verified one.
      const block = blocks.find((b) => b.reference === input.reference);
      return block
        ? { block }
        : {
            error: 'This label does not match any block of this swap: it may be damaged or made up. Type its short code instead.',
          };
    }
    const block = blocks.find((b) => b.shortCode === input.code);
    return block
      ? { block }
      : {
          error: `No block of this swap has the code ${formatShortCode(input.code)}. Check the letters (there is no 0, O, 1 or I).`,
        };
  };

  /** Matches a scanned reference or typed short code and takes the block in. True when a block is open. */
  const submitCode = async (text: string): Promise<boolean> => {
    setCodeError(null);
    const local = findLocally(text);
    const input = classifyIntakeInput(text);
    let block = local.block;
    if (navigator.onLine && input.kind !== 'invalid') {
      setResolving(true);
      const abort = new AbortController();
      const timeout = setTimeout(() => abort.abort(), RESOLVE_TIMEOUT_MS);
      try {
        const body = input.kind === 'reference' ? { swapId, reference: input.reference } : { swapId, shortCode: input.code };
        const answer = await resolveBlock(body, abort.signal);
        block = {
          ...answer.block,
          ...(local.block && local.block.id === answer.block.id ? pickNewer(local.block, answer.block) : {}),
        };
      } catch (error) {
        // The server's refusal is the better message; no answer at all falls back to the kept copy.
        if (error instanceof ApiError && error.status > 0 && error.status < 500) {
          setCodeError(error.message);
          return false;
        }
      } finally {
        clearTimeout(timeout);
        setResolving(false);
      }
    }
    if (!block) {
      setCodeError(local.error ?? 'That code could not be matched.');
      return false;
    }
    if (block.state === 'returned') {
      setCodeError(`${blockLabel(block)} was already returned to a member; there is nothing to take in.`);
      return false;
    }
    if (isBlockStateBefore(block.state, 'received')) {
      await enqueue({ clientId: newClientId(), kind: 'receive', swapId, blockId: block.id, userId, label: blockLabel(block) });
      block = { ...block, state: 'received' };
      patchBlock(block.id, { state: 'received' });
      notifyQueueChanged();
      void flushQueue();
    }
    setCurrent(block);
    return true;
  };

  /** Queues the measurement of the open block and shows the verdict worked out on this device. */
  const submitMeasurement = async (measured: MeasurementSend): Promise<StationResult | null> => {
    const block = current;
    if (!block) return null;
    const { swap } = packRef.current;
    const local = checkBlock({ target: swap.unfinished, tolerance: swap.tolerance, squareness: swap.squareness, measured });
    const clientId = newClientId();
    await enqueue({
      clientId,
      kind: 'measure',
      swapId,
      blockId: block.id,
      userId,
      body: measured,
      label: blockLabel(block),
      localVerdict: local.verdict,
    });
    const result: StationResult = { clientId, block, measured, local, confirmed: null };
    setResults((rs) => [result, ...rs].slice(0, RECENT));
    setCurrent(null);
    patchBlock(block.id, { state: 'measured', verdict: local.verdict });
    notifyQueueChanged();
    void flushQueue();
    return result;
  };

  return {
    current,
    results,
    codeError,
    resolving,
    submitCode,
    submitMeasurement,
    cancel: () => setCurrent(null),
    clearError: () => setCodeError(null),
  };
}
