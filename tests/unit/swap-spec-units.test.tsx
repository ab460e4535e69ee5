// @vitest-environment happy-dom
/**
 * The swap page's spec card and the printable swap sheet write every length in the viewer's unit, as
 * the block drawing does. A nine-patch cut from three 3½″ strips each way is 9½″ cut and 9″ finished
 * with ¼″ seams; in millimetre mode that is 241.3 mm, 228.6 mm and 6.4 mm, its 3½″ patches 88.9 mm,
 * and a ⅛″ tolerance 3.2 mm (25.4 mm to the inch, NIST SP 811; tenths rounded half up).
 */
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, render, screen, within } from '@testing-library/react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { MemoryRouter, Route, Routes } from 'react-router';
import type { ReactNode } from 'react';
import type { Units } from '../../shared/schemas/auth';
import type { SwapDto } from '../../shared/swap-types';
import type { MeDto } from '../../shared/types';
import { meKeys } from '../../src/entities/me/api/me-keys';
import { swapKeys } from '../../src/entities/swap/api/swap-keys';
import { SpecCard } from '../../src/features/swaps/components/spec-card';
import { SwapSheetPage } from '../../src/features/swaps/components/swap-sheet-page';
import { cuttingPlan } from '../../src/features/swaps/hooks/use-cutting-plan';

const GUILD = 7;
const SWAP = 31;

const ninePatchSwap = {
  id: SWAP,
  guildId: GUILD,
  title: 'Wrenfield nine-patch',
  state: 'signup',
  mode: 'return',
  unfinished: { width: 9.5, height: 9.5 },
  finished: { width: 9, height: 9 },
  seam: 0.25,
  tolerance: 0.125,
  squareness: 0.25,
  signupClosesAt: '2026-02-01T00:00:00.000Z',
  dueAt: '2026-03-01T00:00:00.000Z',
  quota: { min: 1, max: 4 },
  signups: 0,
  pledged: 0,
  myPledge: 0,
  description: '',
  block: {
    kind: 'grid',
    columns: [3.5, 3.5, 3.5],
    rows: [3.5, 3.5, 3.5],
    seam: 0.25,
    roles: [
      ['Dark', 'Light', 'Dark'],
      ['Light', 'Dark', 'Light'],
      ['Dark', 'Light', 'Dark'],
    ],
  },
  colourRules: [
    { role: 'Dark', note: 'any deep blue' },
    { role: 'Light', note: 'a cream' },
  ],
  signupReminderDays: 7,
  dueReminderDays: 2,
  giftRecipient: null,
  fees: { entry: 0, postage: 0 },
  createdBy: null,
  createdAt: '2026-01-01T00:00:00.000Z',
  updatedAt: '2026-01-01T00:00:00.000Z',
  distributionConfirmedAt: null,
  signupOpen: true,
  guild: { id: GUILD, name: 'Wrenfield Quilters', timeZone: 'America/Chicago' },
  myRole: 'member',
  canManage: false,
} as SwapDto;

function me(units: Units): MeDto {
  return {
    user: { id: 1, email: 'ada@example.test', displayName: 'Ada', units, unitsChosen: true, mailingAddress: null },
    memberships: [{ guildId: GUILD, guildName: 'Wrenfield Quilters', role: 'member', defaultUnit: 'in' }],
  };
}

function renderWith(units: Units, ui: ReactNode) {
  const client = new QueryClient({ defaultOptions: { queries: { staleTime: Infinity, retry: false } } });
  client.setQueryData(meKeys.me(), me(units));
  client.setQueryData(swapKeys.detail(SWAP), ninePatchSwap);
  return render(<QueryClientProvider client={client}>{ui}</QueryClientProvider>);
}

const sheet = (
  <MemoryRouter initialEntries={[`/guilds/${GUILD}/swaps/${SWAP}/sheet`]}>
    <Routes>
      <Route path="/guilds/:guildId/swaps/:swapId/sheet" element={<SwapSheetPage />} />
    </Routes>
  </MemoryRouter>
);

/** The text of the definition beside a term in the spec list. */
const definition = (root: HTMLElement, term: string) =>
  within(root).getAllByText(term, { selector: 'dt' })[0]!.nextElementSibling!.textContent!.replace(/\s+/g, ' ').trim();

afterEach(cleanup);

describe('spec card in millimetre mode', () => {
  it('writes the sizes, seam, tolerance and cut sizes in millimetres', () => {
    const { container } = renderWith('mm', <SpecCard swap={ninePatchSwap} />);
    expect(definition(container, 'Unfinished')).toBe('241.3 mm × 241.3 mm (cut edge to cut edge)');
    expect(definition(container, 'Finished')).toBe('228.6 mm × 228.6 mm in the quilt, with 6.4 mm seams');
    expect(definition(container, 'Tolerance')).toBe('± 3.2 mm on each side; diagonals within 6.4 mm of each other');
    const cutSizes = screen.getAllByRole('cell').filter((c) => c.dataset.label === 'Cut size');
    expect(cutSizes.length).toBeGreaterThan(0);
    for (const c of cutSizes) expect(c.textContent).toBe('88.9 mm × 88.9 mm');
    expect(container.textContent).toContain('sewn width 241.3 mm');
    expect(container.textContent).not.toContain('″');
  });

  it('keeps inches for a viewer in inch mode', () => {
    const { container } = renderWith('in', <SpecCard swap={ninePatchSwap} />);
    expect(definition(container, 'Unfinished')).toBe('9½″ × 9½″ (cut edge to cut edge)');
    expect(definition(container, 'Tolerance')).toBe('± ⅛″ on each side; diagonals within ¼″ of each other');
    expect(container.textContent).not.toContain(' mm');
  });
});

describe('swap sheet in millimetre mode', () => {
  it('writes every length in millimetres, the yardage staying in yards', async () => {
    renderWith('mm', sheet);
    const page = (await screen.findByRole('heading', { name: 'Wrenfield nine-patch' })).closest('article')!;
    expect(definition(page, 'Unfinished size')).toBe('241.3 mm × 241.3 mm');
    expect(definition(page, 'Finished size')).toBe('228.6 mm × 228.6 mm (6.4 mm seams)');
    expect(definition(page, 'Tolerance')).toBe('± 3.2 mm each side; diagonals within 6.4 mm');
    expect(page.textContent).toContain('Measure your block before handing it in: 241.3 mm × 241.3 mm from cut edge to cut edge.');
    expect(within(page).getByRole('table', { name: /Cut list/ }).textContent).toContain('88.9 mm × 88.9 mm');
    expect(within(page).getByRole('table', { name: /Yardage/ }).textContent).toContain('Dark⅜ yd');
    expect(page.textContent).not.toContain('″');
  });
});

describe('cutting plan notes', () => {
  it('write the trim size in the viewer unit', () => {
    const hst = { kind: 'hst', finished: 3, method: 'trim' } as const;
    expect(cuttingPlan(hst, 2, [], 'mm').notes).toContain('Trim each HST to 88.9 mm square.');
    expect(cuttingPlan(hst, 2).notes).toContain('Trim each HST to 3½″ square.');
  });
});
