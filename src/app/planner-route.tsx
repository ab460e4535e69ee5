import { PlannerPage } from '@/features/planner/components/planner-page';
import { useMe } from '@/entities/me/api/get-me';

/** The planner starts in the units the person chose in their settings. */
export function PlannerRoute() {
  const me = useMe();
  return <PlannerPage defaultUnits={me.data?.user.units ?? 'in'} />;
}
