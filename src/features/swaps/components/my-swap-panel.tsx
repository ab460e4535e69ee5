import { useState } from 'react';
import type { SwapDto } from '@shared/swap-types';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { TextField } from '@/components/ui/fields';
import { SafetyCautions } from '@/components/ui/safety-cautions';
import { ApiError } from '@/lib/api-client';
import { useBlocks } from '@/entities/block/api/get-blocks';
import { useMe } from '@/entities/me/api/get-me';
import { unitsFor } from '@/entities/me/api/units';
import { usePledge } from '../api/pledge';
import { useWithdraw } from '../api/withdraw';
import { useCuttingPlan } from '../hooks/use-cutting-plan';
import { CuttingPlanView } from './cutting-plan-view';
import { HandInSeveral } from './hand-in-several';
import { MyBlockCard } from './my-block-card';

function PledgeForm({ swap }: { swap: SwapDto }) {
  const pledge = usePledge(swap.id);
  const withdraw = useWithdraw(swap.id);
  const [count, setCount] = useState(String(swap.myPledge || swap.quota.min));
  const [error, setError] = useState('');
  const [problem, setProblem] = useState('');
  const range = swap.quota.min === swap.quota.max ? `${swap.quota.min}` : `${swap.quota.min} to ${swap.quota.max}`;

  const report = (e: unknown) => {
    if (e instanceof ApiError && e.fields.blocks) setError(e.fields.blocks);
    else setProblem(e instanceof ApiError ? e.message : 'That did not work. Please try again.');
  };
  return (
    <form
      className="space-y-3"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        setError('');
        setProblem('');
        const n = Number(count);
        if (!Number.isInteger(n) || n < swap.quota.min || n > swap.quota.max) return setError(`Pledge ${range} blocks.`);
        pledge.mutate(n, { onError: report });
      }}
    >
      {problem && <Alert tone="error">{problem}</Alert>}
      <div className="flex flex-wrap items-end gap-3">
        <TextField
          label="Blocks I will make"
          hint={`${range} per member`}
          type="number"
          min={swap.quota.min}
          max={swap.quota.max}
          value={count}
          onChange={(e) => setCount(e.target.value)}
          error={error}
          wrapperClassName="w-48"
        />
        <Button type="submit" pending={pledge.isPending} pendingLabel="Saving…">
          {swap.myPledge ? 'Change my pledge' : 'Sign up'}
        </Button>
        {swap.myPledge > 0 && (
          <Button
            variant="quiet"
            pending={withdraw.isPending}
            onClick={() => {
              if (window.confirm('Withdraw from this swap? Your pledged blocks are removed.'))
                withdraw.mutate(undefined, { onError: report });
            }}
          >
            Withdraw
          </Button>
        )}
      </div>
    </form>
  );
}

function WhatComesBack({ swap, acceptedOfMine }: { swap: SwapDto; acceptedOfMine: number }) {
  const incoming = useBlocks(swap.id, 'incoming', Boolean(swap.distributionConfirmedAt));
  if (swap.mode === 'gift')
    return <p>Every accepted block goes to {swap.giftRecipient?.name ?? 'the recipient'}; thank you for sewing.</p>;
  if (!swap.distributionConfirmedAt) {
    return (
      <p>
        When the coordinator has measured every block, you get back as many blocks as were accepted of yours, made by other
        members.
        {acceptedOfMine > 0 && ` So far ${acceptedOfMine} of yours ${acceptedOfMine === 1 ? 'is' : 'are'} accepted.`}
      </p>
    );
  }
  const list = incoming.data ?? [];
  const byMaker = new Map<string, number[]>();
  for (const b of list) byMaker.set(b.maker.displayName, [...(byMaker.get(b.maker.displayName) ?? []), b.sequence]);
  return (
    <div>
      <p className="font-semibold">
        You receive {list.length} block{list.length === 1 ? '' : 's'}:
      </p>
      <ul className="list-disc pl-6">
        {[...byMaker].map(([name, seqs]) => (
          <li key={name}>
            {seqs.length} from {name} (block{seqs.length === 1 ? '' : 's'} {seqs.join(', ')})
          </li>
        ))}
      </ul>
    </div>
  );
}

/** A member's own part in the swap: pledge, cutting plan for exactly that pledge, blocks, and the return. */
export function MySwapPanel({ swap }: { swap: SwapDto }) {
  const blocks = useBlocks(swap.id, 'mine', swap.myPledge > 0 || swap.state !== 'signup');
  const mine = blocks.data ?? [];
  const pledged = mine.length || swap.myPledge;
  const roles = swap.colourRules.map((r) => r.role);
  const units = unitsFor(useMe().data, swap.guildId);
  const { plan, problem } = useCuttingPlan(pledged > 0 ? swap.block : null, pledged, roles, units);

  if (swap.state === 'draft' || swap.state === 'cancelled') return null;
  return (
    <Card title="My swap">
      <div className="space-y-6">
        {swap.signupOpen ? (
          <PledgeForm swap={swap} />
        ) : (
          pledged === 0 && (
            <p>
              Sign-up is closed{swap.state === 'signup' ? ' (its date has passed)' : ''}, and you did not pledge blocks for this
              swap.
            </p>
          )
        )}
        {pledged > 0 && (
          <>
            <section>
              <h3 className="text-xl font-semibold text-indigo-deep">
                Cutting plan for your {pledged} block{pledged === 1 ? '' : 's'}
              </h3>
              <div className="mt-3">{plan ? <CuttingPlanView plan={plan} units={units} /> : problem && <p>{problem}</p>}</div>
            </section>
            <SafetyCautions topics={['cutting', 'pressing']} />
            <section>
              <h3 className="text-xl font-semibold text-indigo-deep">Your blocks</h3>
              {blocks.isError && <Alert tone="error">Your blocks could not be loaded.</Alert>}
              {['sewing', 'collecting'].includes(swap.state) && mine.length > 1 && (
                <div className="mt-3">
                  <HandInSeveral swap={swap} blocks={mine} onUndone={() => void blocks.refetch()} />
                </div>
              )}
              <ul className="mt-3 grid gap-4 lg:grid-cols-2">
                {mine.map((b) => (
                  <MyBlockCard key={b.id} swap={swap} block={b} />
                ))}
              </ul>
            </section>
            <section>
              <h3 className="text-xl font-semibold text-indigo-deep">What comes back</h3>
              <WhatComesBack swap={swap} acceptedOfMine={mine.filter((b) => b.accepted).length} />
            </section>
          </>
        )}
      </div>
    </Card>
  );
}
