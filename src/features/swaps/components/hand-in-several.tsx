import { HandInFields } from './hand-in-fields';
import { UndoNotice } from '@/components/ui/undo-notice';
import { useState } from 'react';
import type { BlockDto, SwapDto } from '@shared/swap-types';
import { isBlockStateBefore } from '@shared/vocabulary';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { ApiError } from '@/lib/api-client';
import { useUndoWindow } from '@/lib/use-undo-window';
import { undoBlock } from '@/entities/block/api/undo-block';
import { useHandInMany } from '../api/hand-in-many';

/** The maker ticks the blocks she brings (all are ticked to start with) and hands them in with one tap. */
export function HandInSeveral({ swap, blocks, onUndone }: { swap: SwapDto; blocks: BlockDto[]; onUndone: () => void }) {
  const open = blocks.filter((b) => isBlockStateBefore(b.state, 'received'));
  const [chosen, setChosen] = useState<Set<number>>(() => new Set(open.filter((b) => b.state !== 'handed_in').map((b) => b.id)));
  const [how, setHow] = useState<'in-person' | 'post'>('in-person');
  const [note, setNote] = useState('');
  const [problem, setProblem] = useState('');
  const [undoing, setUndoing] = useState(false);
  const handIn = useHandInMany(swap.id);
  const undoWindow = useUndoWindow<number[]>();
  if (open.length < 2 && !undoWindow.current) return null;

  const toggle = (id: number) =>
    setChosen((c) => {
      const next = new Set(c);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });
  const report = (e: unknown) =>
    setProblem(e instanceof ApiError ? (e.fields.blockIds ?? e.message) : 'That did not work. Please try again.');

  const undoAll = async (ids: number[]) => {
    setUndoing(true);
    setProblem('');
    try {
      for (const id of ids) await undoBlock(id);
      undoWindow.clear();
    } catch (e) {
      report(e);
    } finally {
      setUndoing(false);
      onUndone();
    }
  };

  return (
    <section className="rounded-lg bg-linen p-4" aria-labelledby="hand-in-several">
      <h4 id="hand-in-several" className="text-lg font-semibold">
        Hand in several blocks at once
      </h4>
      {undoWindow.current ? (
        <UndoNotice
          className="mt-2"
          message={`${undoWindow.current.length} block${undoWindow.current.length === 1 ? '' : 's'} handed in`}
          pending={undoing}
          onUndo={() => void undoAll(undoWindow.current!)}
        />
      ) : (
        <form
          className="mt-2 space-y-3"
          onSubmit={(e) => {
            e.preventDefault();
            setProblem('');
            const blockIds = open.filter((b) => chosen.has(b.id)).map((b) => b.id);
            if (blockIds.length === 0) return setProblem('Tick at least one block.');
            handIn.mutate(
              { blockIds, how, ...(note.trim() ? { note: note.trim() } : {}) },
              { onError: report, onSuccess: () => undoWindow.offer(blockIds) },
            );
          }}
        >
          <fieldset>
            <legend className="font-semibold">Blocks you hand in</legend>
            <ul className="mt-1 flex flex-wrap gap-x-5">
              {open.map((b) => (
                <li key={b.id}>
                  <label className="inline-flex min-h-11 cursor-pointer items-center gap-2">
                    <input
                      type="checkbox"
                      className="size-6 accent-indigo"
                      checked={chosen.has(b.id)}
                      onChange={() => toggle(b.id)}
                    />
                    Block {b.sequence}
                    {b.state === 'handed_in' && <span className="text-walnut-soft">(handed in already)</span>}
                  </label>
                </li>
              ))}
            </ul>
          </fieldset>
          <HandInFields how={how} note={note} onHowChange={setHow} onNoteChange={setNote} />
          <Button type="submit" pending={handIn.isPending} pendingLabel="Handing in…">
            Hand in {chosen.size} block{chosen.size === 1 ? '' : 's'}
          </Button>
        </form>
      )}
      {problem && (
        <div className="mt-3">
          <Alert tone="error">{problem}</Alert>
        </div>
      )}
    </section>
  );
}
