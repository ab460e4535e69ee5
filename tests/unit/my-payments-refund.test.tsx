// @vitest-environment happy-dom
/**
 * A member's payments while a refund is on its way: the line says so until the payment service
 * confirms the refund by webhook. (That the page keeps asking meanwhile is tests/e2e/payments.test.ts.)
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, render } from '@testing-library/react';
import { MemoryRouter } from 'react-router';
import type { MyPaymentDto } from '../../shared/schemas/payments';

const calls = vi.hoisted(() => ({ data: [] as MyPaymentDto[] }));
vi.mock('../../src/features/payments/api/get-my-payments', () => ({
  useMyPayments: () => ({ isPending: false, isError: false, data: calls.data }),
}));
const { MyPaymentsPage } = await import('../../src/features/payments/components/my-payments-page');

afterEach(cleanup);

const fee: MyPaymentDto = {
  id: 7,
  kind: 'entry',
  swapId: 3,
  amount: 600,
  currency: 'usd',
  status: 'paid',
  guildId: 1,
  guildName: 'Kestrel Hollow Quilters',
  swapTitle: 'Weathervane Stars',
  createdAt: '2026-11-02T15:00:00.000Z',
  paidAt: '2026-11-02T15:01:00.000Z',
  refundedAt: null,
  refundOnItsWay: true,
};

describe('a refund on its way', () => {
  it('is told on the payment’s line until it is through', () => {
    calls.data = [fee];
    const { container, unmount } = render(<MyPaymentsPage />, { wrapper: MemoryRouter });
    expect(container.textContent).toContain('refund on its way');
    unmount();
    calls.data = [{ ...fee, status: 'refunded', refundedAt: '2026-11-03T09:00:00.000Z', refundOnItsWay: false }];
    const after = render(<MyPaymentsPage />, { wrapper: MemoryRouter });
    expect(after.container.textContent).not.toContain('refund on its way');
    expect(after.container.textContent).toMatch(/refunded/);
  });
});
