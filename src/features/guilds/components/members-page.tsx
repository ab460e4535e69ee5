import { useState } from 'react';
import { useParams } from 'react-router';
import { roleLabels, roles, type Role } from '@shared/schemas/guilds';
import { Card } from '@/components/ui/card';
import { Button } from '@/components/ui/button';
import { Alert } from '@/components/ui/alert';
import { Loading, QueryError } from '@/components/ui/page';
import { ApiError } from '@/lib/api-client';
import { useGuild } from '@/entities/guild/api/get-guild';
import { useMembers } from '@/entities/guild/api/get-members';
import { useChangeRole, useRemoveMember } from '../api/member-mutations';
import { InviteCard } from './invite-card';

export function MembersPage() {
  const guildId = Number(useParams().guildId);
  const guild = useGuild(guildId);
  const members = useMembers(guildId);
  const changeRole = useChangeRole(guildId);
  const removeMember = useRemoveMember(guildId);
  const [problem, setProblem] = useState('');
  const isAdmin = guild.data?.myRole === 'admin';
  const canInvite = guild.data?.myRole === 'admin' || guild.data?.myRole === 'coordinator';

  const report = (error: unknown) =>
    setProblem(error instanceof ApiError ? error.message : 'That did not work. Please try again.');

  if (members.isPending || guild.isPending) return <Loading label="Loading members…" />;
  if (members.isError) return <QueryError error={members.error} what="the members" />;

  return (
    <div className="space-y-8">
      <Card title={`Members (${members.data.length})`}>
        {problem && (
          <div className="mb-4">
            <Alert tone="error">{problem}</Alert>
          </div>
        )}
        <div>
          <table className="stack-table w-full border-collapse text-left">
            <caption className="sr-only">Guild members and their roles</caption>
            <thead>
              <tr className="border-b-2 border-walnut/20">
                <th scope="col" className="py-2 pr-4">
                  Name
                </th>
                <th scope="col" className="py-2 pr-4">
                  E-mail
                </th>
                <th scope="col" className="py-2 pr-4">
                  Role
                </th>
                {isAdmin && (
                  <th scope="col" className="py-2">
                    <span className="sr-only">Actions</span>
                  </th>
                )}
              </tr>
            </thead>
            <tbody>
              {members.data.map((m) => (
                <tr key={m.userId} className="border-b border-walnut/10">
                  <td className="py-3 pr-4 font-semibold">{m.displayName}</td>
                  <td data-label="E-mail" className="py-3 pr-4 break-all">
                    {m.email}
                  </td>
                  <td data-label="Role" className="py-3 pr-4">
                    {isAdmin ? (
                      <select
                        aria-label={`Role of ${m.displayName}`}
                        className="min-h-11 rounded-lg border-2 border-walnut/30 bg-white px-2"
                        value={m.role}
                        onChange={(e) => {
                          setProblem('');
                          changeRole.mutate({ userId: m.userId, role: e.target.value as Role }, { onError: report });
                        }}
                      >
                        {roles.map((r) => (
                          <option key={r} value={r}>
                            {roleLabels[r]}
                          </option>
                        ))}
                      </select>
                    ) : (
                      roleLabels[m.role]
                    )}
                  </td>
                  {isAdmin && (
                    <td className="py-3 text-right">
                      <Button
                        variant="quiet"
                        onClick={() => {
                          if (!window.confirm(`Remove ${m.displayName} from the guild?`)) return;
                          setProblem('');
                          removeMember.mutate(m.userId, { onError: report });
                        }}
                      >
                        Remove<span className="sr-only"> {m.displayName}</span>
                      </Button>
                    </td>
                  )}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </Card>
      {canInvite && <InviteCard guildId={guildId} canInviteOfficers={isAdmin} />}
    </div>
  );
}
