import type { LabelSheetDataDto } from '@shared/schemas/intake';
import { paginate, type LabelSheet } from './label-sheets';
import { LabelCard } from './label-card';

/** Printed sheets of labels at their real size, one page each; skipped positions stay blank. */
export function LabelSheets({ data, sheet, skip }: { data: LabelSheetDataDto; sheet: LabelSheet; skip: number }) {
  const pages = paginate(data.labels, sheet, skip);
  return (
    <div className="overflow-x-auto print:overflow-visible">
      {pages.map((cells, page) => (
        <section
          key={page}
          aria-label={`Sheet ${page + 1} of ${pages.length}`}
          className={`label-sheet sheet-${sheet.id}`}
          data-testid="label-sheet"
        >
          {cells.map((cell, i) =>
            cell.kind === 'label' ? (
              <div key={cell.label.blockId} className="label-cell" data-testid="label">
                <LabelCard label={cell.label} swap={data.swap} />
              </div>
            ) : (
              <div key={`skip-${i}`} className="label-cell" data-skipped="" aria-hidden="true" />
            ),
          )}
        </section>
      ))}
    </div>
  );
}
