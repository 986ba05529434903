'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { apiFetch } from '@/lib/api-client';

type Team = { id: string; name: string; role: string; current: boolean };

/** Shown only when the user belongs to more than one team. */
export function TeamSwitcher({ teams }: { teams: Team[] }) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const current = teams.find((t) => t.current);
  if (teams.length < 2) {
    return current ? <span className="hidden text-[13px] text-slate md:inline">{current.name}</span> : null;
  }
  return (
    <label className="flex items-center gap-1.5 text-[13px]">
      <span className="sr-only">Current team</span>
      <select
        className="h-8 rounded-[3px] border border-rule bg-chalk px-2 text-[13px]"
        value={current?.id}
        disabled={pending}
        onChange={async (e) => {
          setPending(true);
          // A refusal leaves the current team as it was; the refresh shows which one that is.
          await apiFetch('/api/teams/current', { method: 'PUT', body: { teamId: e.target.value } }).catch(() => null);
          setPending(false);
          router.refresh();
        }}
      >
        {teams.map((t) => (
          <option key={t.id} value={t.id}>
            {t.name} ({t.role})
          </option>
        ))}
      </select>
    </label>
  );
}
