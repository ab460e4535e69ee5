import type { RosterRowDto } from '@shared/swap-types';
import { BlockMarkers } from './block-markers';
import { VerdictCounts } from '@/entities/block/components/verdict-badge';

const columns = [
  ['pledged', 'Pledged'],
  ['sewn', 'Sewn'],
  ['handedIn', 'Handed in'],
  ['received', 'Received'],
  ['measured', 'Measured'],
] as const;

/** A card per maker on a phone. */
function RowCard({ row }: { row: RosterRowDto }) {
  return (
    <li className="rounded-lg bg-card p-4 ring-1 ring-walnut/10">
      <div className="flex items-baseline justify-between gap-2">
        <h3 className="text-lg font-semibold">{row.displayName}</h3>
        <span className={row.owed > 0 ? 'font-semibold text-madder-deep' : 'text-lichen-deep'}>
          {row.owed > 0 ? `owes ${row.owed}` : 'nothing owed'}
        </span>
      </div>
      <dl className="mt-2 grid grid-cols-2 gap-x-5 gap-y-1 text-base">
        {columns.map(([key, label]) => (
          <div key={key} className="flex justify-between gap-1">
            <dt className="text-walnut-soft">{label}</dt>
            <dd className="font-semibold">{row[key]}</dd>
          </div>
        ))}
      </dl>
      {row.verdicts && (
        <div className="mt-2">
          <VerdictCounts counts={row.verdicts} />
        </div>
      )}
      <BlockMarkers blocks={row.blocks} />
    </li>
  );
}

/** One row per participant: a table on wide screens, cards on narrow ones. */
export function BoardRows({ rows }: { rows: RosterRowDto[] }) {
  if (rows.length === 0) return <p className="text-walnut-soft">Nobody has signed up yet.</p>;
  return (
    <>
      <ul className="space-y-3 md:hidden">
        {rows.map((r) => (
          <RowCard key={r.userId} row={r} />
        ))}
      </ul>
      <div className="hidden overflow-x-auto md:block">
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">Each participant’s blocks along the way</caption>
          <thead>
            <tr className="border-b-2 border-walnut/20">
              <th scope="col" className="py-2 pr-3">
                Member
              </th>
              {columns.map(([key, label]) => (
                <th key={key} scope="col" className="px-2 py-2 text-right">
                  {label}
                </th>
              ))}
              <th scope="col" className="px-2 py-2 text-right">
                Still owed
              </th>
              <th scope="col" className="py-2 pl-3">
                Verdicts
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.userId} className="border-b border-walnut/10 align-top">
                <th scope="row" className="py-3 pr-3 text-left font-semibold">
                  {r.displayName}
                  <BlockMarkers blocks={r.blocks} />
                </th>
                {columns.map(([key]) => (
                  <td key={key} className="px-2 py-3 text-right tabular-nums">
                    {r[key]}
                  </td>
                ))}
                <td className={`px-2 py-3 text-right tabular-nums ${r.owed > 0 ? 'font-bold text-madder-deep' : ''}`}>
                  {r.owed}
                </td>
                <td className="py-3 pl-3">{r.verdicts && <VerdictCounts counts={r.verdicts} />}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}
