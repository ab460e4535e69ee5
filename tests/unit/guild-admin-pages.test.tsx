// @vitest-environment happy-dom
/**
 * A guild's admin-only pages (its e-mail history and its payments) opened by someone else from a link:
 * they are told whose page it is and never see the page's filters above a refusal; an admin gets the page.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, render } from '@testing-library/react';
import { MemoryRouter, Route, Routes } from 'react-router';
import type { Role } from '../../shared/schemas/guilds';

const guild = vi.hoisted(() => ({ role: 'member' as Role }));
vi.mock('../../src/entities/guild/api/get-guild', () => ({
  useGuild: () => ({ isPending: false, isError: false, data: { id: 4, name: 'Kestrel Hollow Quilters', myRole: guild.role } }),
}));
const { RequireGuildAdmin } = await import('../../src/app/guards');

afterEach(cleanup);

function openAs(role: Role, path: string) {
  guild.role = role;
  return render(
    <MemoryRouter initialEntries={[path]}>
      <Routes>
        <Route path="/guilds/:guildId" element={<RequireGuildAdmin />}>
          <Route path="mail" element={<p>The e-mail history</p>} />
          <Route path="payments" element={<p>The payments</p>} />
        </Route>
      </Routes>
    </MemoryRouter>,
  );
}

describe('a guild’s admin-only pages', () => {
  it.each(['coordinator', 'member'] as const)('tell a %s whose page it is, with the way back', (role) => {
    for (const path of ['/guilds/4/mail', '/guilds/4/payments']) {
      const { container, getByRole, unmount } = openAs(role, path);
      expect(container.textContent).toContain('This page is for the guild’s admins');
      expect(container.textContent).toContain('Ask an admin of Kestrel Hollow Quilters');
      expect(container.textContent).not.toMatch(/The e-mail history|The payments/);
      expect(getByRole('link', { name: 'Back to the guild’s swaps' }).getAttribute('href')).toBe('/guilds/4');
      unmount();
    }
  });

  it('show an admin the page itself', () => {
    expect(openAs('admin', '/guilds/4/mail').container.textContent).toBe('The e-mail history');
    cleanup();
    expect(openAs('admin', '/guilds/4/payments').container.textContent).toBe('The payments');
  });
});
