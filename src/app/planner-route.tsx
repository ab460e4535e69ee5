import { PlannerPage } from '@/features/planner/components/planner-page';
import { useMe } from '@/entities/me/api/get-me';
import { unitsFor } from '@/entities/me/api/units';

/** The planner starts in the person's unit: their own choice, or their guilds' default. */
export function PlannerRoute() {
  const me = useMe();
  return <PlannerPage defaultUnits={unitsFor(me.data)} />;
}
