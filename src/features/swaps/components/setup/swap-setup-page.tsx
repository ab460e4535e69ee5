import { useState } from 'react';
import { useForm, type Path } from 'react-hook-form';
import { Link, useNavigate, useParams } from 'react-router';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Loading, PageHeader, QueryError } from '@/components/ui/page';
import { useGuild } from '@/entities/guild/api/get-guild';
import { useMe } from '@/entities/me/api/get-me';
import { unitsFor } from '@/entities/me/api/units';
import type { Units } from '@shared/schemas/auth';
import { ApiError } from '@/lib/api-client';
import { paths } from '@/lib/paths';
import type { SwapDto } from '@shared/swap-types';
import { useCreateSwap } from '../../api/create-swap';
import { useSwap } from '@/entities/swap/api/get-swap';
import { useUpdateSwap } from '../../api/update-swap';
import { StepBasics } from './step-basics';
import { StepBlock } from './step-block';
import { StepFabric } from './step-fabric';
import { StepReview } from './step-review';
import { StepSchedule } from './step-schedule';
import {
  defaultValues,
  fieldName,
  scheduleBody,
  stepOf,
  toBody,
  validateValues,
  valuesFromSwap,
  type SetupValues,
} from './setup-values';

const STEPS = ['Basics', 'Block', 'Fabric and colour', 'Quota, dates and mode', 'Review'] as const;

/** New swap: /guilds/:guildId/swaps/new. */
export function NewSwapPage() {
  const guildId = Number(useParams().guildId);
  const guild = useGuild(guildId);
  // A bare number is in the person's unit (their own, or the guild's until they choose).
  const me = useMe();
  if (guild.isPending || me.isPending) return <Loading />;
  if (guild.isError) return <QueryError error={guild.error} what="the guild" />;
  const units = unitsFor(me.data, guildId);
  return (
    <SwapSetupForm
      guildId={guildId}
      timeZone={guild.data.timeZone}
      units={units}
      initial={defaultValues(guild.data.timeZone, guild.data.currency, units)}
    />
  );
}

/** Edit: /guilds/:guildId/swaps/:swapId/edit. */
export function EditSwapPage() {
  const guildId = Number(useParams().guildId);
  const swap = useSwap(Number(useParams().swapId));
  const guild = useGuild(guildId);
  const me = useMe();
  if (swap.isPending || guild.isPending || me.isPending) return <Loading />;
  if (swap.isError) return <QueryError error={swap.error} what="the swap" />;
  if (guild.isError) return <QueryError error={guild.error} what="the guild" />;
  const units = unitsFor(me.data, guildId);
  return (
    <SwapSetupForm
      guildId={guildId}
      timeZone={swap.data.guild.timeZone}
      units={units}
      initial={valuesFromSwap(swap.data, guild.data.currency, units)}
      swap={swap.data}
    />
  );
}

/** Which steps a swap can still change: the spec only in draft or sign-up. */
const stepsFor = (swap?: SwapDto) => (swap && swap.state !== 'draft' && swap.state !== 'signup' ? [0, 3] : [0, 1, 2, 3, 4]);

function SwapSetupForm({
  guildId,
  timeZone,
  initial,
  swap,
  units,
}: {
  guildId: number;
  timeZone: string;
  /** What a bare number typed as a length means. */
  units: Units;
  initial: SetupValues;
  swap?: SwapDto;
}) {
  const navigate = useNavigate();
  const create = useCreateSwap(guildId);
  const update = useUpdateSwap(swap?.id ?? 0);
  const steps = stepsFor(swap);
  const scheduleOnly = steps.length === 2;
  const [at, setAt] = useState(0);
  const [formError, setFormError] = useState('');
  const form = useForm<SetupValues>({ defaultValues: initial, mode: 'onSubmit' });
  const step = steps[at]!;
  const last = at === steps.length - 1;

  /** Puts the schema's messages beside the fields of the given steps; true when they are clean. */
  function check(onlySteps: number[]) {
    form.clearErrors();
    const problems = Object.entries(validateValues(form.getValues(), timeZone, units)).filter(
      ([f]) => onlySteps.includes(stepOf(f)) && (!scheduleOnly || stepOf(f) !== 1),
    );
    for (const [field, message] of problems) form.setError(field as Path<SetupValues>, { type: 'schema', message });
    return problems;
  }

  async function save() {
    setFormError('');
    const problems = check(steps);
    if (problems.length) {
      setAt(Math.max(0, steps.indexOf(stepOf(problems[0]![0]))));
      setFormError('Some fields need another look; they are marked.');
      return;
    }
    const values = form.getValues();
    try {
      const saved = swap
        ? await update.mutateAsync(scheduleOnly ? scheduleBody(values, timeZone) : toBody(values, timeZone, units))
        : await create.mutateAsync(toBody(values, timeZone, units));
      navigate(paths.swap(guildId, saved.id));
    } catch (error) {
      // Nothing is cleared: the values stay in the form, with the server's messages beside them.
      if (!(error instanceof ApiError)) return setFormError('The swap could not be saved. Please try again.');
      const fields = Object.entries(error.fields).map(
        ([path, message]) => [fieldName(path, values.block.kind), message] as const,
      );
      for (const [field, message] of fields) form.setError(field as Path<SetupValues>, { type: 'server', message });
      if (fields[0]) setAt(Math.max(0, steps.indexOf(stepOf(fields[0][0]))));
      setFormError(error.message);
    }
  }

  const next = () => {
    setFormError('');
    if (check([step]).length === 0) setAt(at + 1);
  };

  return (
    <div className="space-y-6">
      <PageHeader
        title={swap ? `Edit “${swap.title}”` : 'Set up a block swap'}
        lead={
          swap
            ? scheduleOnly
              ? 'Sewing has started, so only the title, description and dates can change.'
              : 'Changes are saved when you press Save.'
            : 'It is saved as a draft: only officers see it until you open sign-up.'
        }
      />
      <ol aria-label="Steps" className="flex flex-wrap gap-2">
        {steps.map((s, i) => (
          <li key={s}>
            <button
              type="button"
              onClick={() => (i < at ? setAt(i) : undefined)}
              aria-current={i === at ? 'step' : undefined}
              className={`inline-flex min-h-11 items-center rounded-full px-4 font-semibold ${i === at ? 'bg-indigo text-white' : i < at ? 'bg-linen-deep text-indigo underline' : 'bg-card text-walnut-soft ring-1 ring-walnut/20'}`}
            >
              {i + 1}. {STEPS[s]}
            </button>
          </li>
        ))}
      </ol>
      <form
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          if (last) void save();
          else next();
        }}
      >
        <Card title={`Step ${at + 1} of ${steps.length}: ${STEPS[step]}`}>
          {formError && (
            <div className="mb-4">
              <Alert tone="error">{formError}</Alert>
            </div>
          )}
          {step === 0 && <StepBasics form={form} />}
          {step === 1 && <StepBlock form={form} units={units} />}
          {step === 2 && <StepFabric form={form} units={units} />}
          {step === 3 && <StepSchedule form={form} guildId={guildId} timeZone={timeZone} scheduleOnly={scheduleOnly} />}
          {step === 4 && <StepReview form={form} timeZone={timeZone} units={units} />}
          <div className="mt-8 flex flex-wrap justify-between gap-3">
            {at > 0 ? (
              <Button variant="secondary" onClick={() => setAt(at - 1)}>
                Back
              </Button>
            ) : (
              <Link
                className="inline-flex min-h-11 items-center font-semibold text-indigo underline"
                to={swap ? paths.swap(guildId, swap.id) : paths.guild(guildId)}
              >
                Cancel
              </Link>
            )}
            <Button type="submit" pending={create.isPending || update.isPending} pendingLabel="Saving…">
              {last ? (swap ? 'Save changes' : 'Save as draft') : 'Next'}
            </Button>
          </div>
        </Card>
      </form>
    </div>
  );
}
