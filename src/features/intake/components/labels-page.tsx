import { Link, useParams, useSearchParams } from 'react-router';
import { labelSheetSchema, type LabelSheetId } from '@shared/schemas/intake';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/fields';
import { EmptyState, Loading, QueryError } from '@/components/ui/page';
import { paths } from '@/lib/paths';
import { useLabels } from '../api/get-labels';
import { useMe } from '@/entities/me/api/get-me';
import { LABEL_SHEETS, defaultSheet, paginate, perSheet, sheetById } from './label-sheets';
import { LabelSheets } from './label-sheet';
import { SingleLabel } from './single-label';
import './labels.css';

const sheetCount = (labels: number, sheets: number) =>
  `${labels} label${labels === 1 ? '' : 's'} on ${sheets} sheet${sheets === 1 ? '' : 's'}`;

/**
 * Labels for a swap's blocks: real-size sheets to print (A4 or US Letter, common label sizes) or one
 * label at a time on a phone. Lives outside the app's frame so the printout is only the sheet.
 */
export function LabelsPage() {
  const guildId = Number(useParams().guildId);
  const swapId = Number(useParams().swapId);
  const [params, setParams] = useSearchParams();
  const parsedSheet = labelSheetSchema.safeParse(params.get('sheet'));
  const sheetId: LabelSheetId = parsedSheet.success ? parsedSheet.data : defaultSheet(navigator.language);
  const viewer = useMe();
  const officer = viewer.data?.memberships.some((m) => m.guildId === guildId && m.role !== 'member') ?? false;
  // Officers print for the whole swap, so they start on every maker's blocks.
  const maker = params.get('maker') ?? (officer ? 'all' : 'me');
  const skip = Math.max(0, Math.trunc(Number(params.get('skip')) || 0));
  const outlines = params.get('outlines') === '1';
  const labels = useLabels(swapId, maker);
  const sheet = sheetById(sheetId);

  const set = (key: string, value: string | null) =>
    setParams(
      (p) => {
        if (value === null) p.delete(key);
        else p.set(key, value);
        return p;
      },
      { replace: true },
    );

  return (
    <div className={`min-h-screen ${outlines ? 'labels-outlines' : ''}`}>
      <header className="border-b border-walnut/15 bg-card print:hidden">
        <div className="mx-auto max-w-6xl px-4 py-4">
          <Link to={paths.swap(guildId, swapId)} className="font-semibold text-indigo underline underline-offset-4">
            ← Back to the swap
          </Link>
          <h1 className="mt-2 text-3xl font-bold text-indigo-deep">Labels{labels.data ? `: ${labels.data.swap.title}` : ''}</h1>
          <p className="max-w-3xl text-walnut-soft">
            Pin a label to each block before you hand it in. The coordinator scans the QR code, or types the short code under it,
            to match the block to you.
          </p>
          <div className="mt-4 flex flex-wrap items-end gap-4">
            <SelectField
              label="Label sheet"
              value={sheetId}
              onChange={(e) => set('sheet', e.target.value)}
              options={LABEL_SHEETS.map((s) => ({ value: s.id, label: s.page ? `${s.name}, ${s.size}` : s.name }))}
              wrapperClassName="min-w-0 max-w-full basis-[26rem]"
            />
            {officer && (
              <SelectField
                label="Whose blocks"
                value={maker === 'all' ? 'all' : 'me'}
                onChange={(e) => set('maker', e.target.value)}
                options={[
                  { value: 'me', label: 'My blocks' },
                  { value: 'all', label: 'Every maker’s blocks' },
                ]}
              />
            )}
            {sheet.page && (
              <TextField
                label="Used labels to skip"
                type="number"
                min={0}
                max={perSheet(sheet) - 1}
                value={String(skip)}
                onChange={(e) => set('skip', e.target.value === '0' ? null : e.target.value)}
                wrapperClassName="w-44"
                hint="On a part-used sheet"
              />
            )}
            {sheet.page && (
              <Button onClick={() => window.print()} disabled={!labels.data?.labels.length}>
                Print
              </Button>
            )}
          </div>
          {sheet.page && (
            <div className="mt-3 space-y-1 text-base text-walnut-soft">
              <label className="flex min-h-11 items-center gap-2">
                <input
                  type="checkbox"
                  className="h-5 w-5"
                  checked={outlines}
                  onChange={(e) => set('outlines', e.target.checked ? '1' : null)}
                />
                Draw the label outlines (for a test print on plain paper, held up to the light against a label sheet)
              </label>
              <p>
                In the print dialog choose {sheet.page}, scale 100 % (“actual size”) and no headers or footers; this page already
                sets no margins.
              </p>
            </div>
          )}
        </div>
      </header>
      <main className="px-4 py-6 print:p-0">
        {labels.isPending || viewer.isPending ? (
          <Loading label="Drawing the labels…" />
        ) : labels.isError ? (
          <div className="mx-auto max-w-3xl">
            <QueryError error={labels.error} what="the labels" />
          </div>
        ) : labels.data.labels.length === 0 ? (
          <div className="mx-auto max-w-3xl">
            <EmptyState title="No blocks to label yet">
              Sign up for the swap first; each pledged block gets its own label.
            </EmptyState>
          </div>
        ) : sheet.page ? (
          <>
            <p className="mb-3 text-center text-walnut-soft print:hidden" role="status">
              {sheetCount(labels.data.labels.length, paginate(labels.data.labels, sheet, skip).length)} of {perSheet(sheet)},{' '}
              {sheet.size} each.
            </p>
            <LabelSheets data={labels.data} sheet={sheet} skip={skip} />
          </>
        ) : (
          <SingleLabel data={labels.data} />
        )}
      </main>
    </div>
  );
}
