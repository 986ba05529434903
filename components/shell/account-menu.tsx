'use client';

import { Button } from '@/components/ui/button';
import { useEffect, useRef, useState } from 'react';

export function AccountMenu({ name, email }: { name: string; email: string }) {
  const [open, setOpen] = useState(false);
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!open) return;
    const close = (e: MouseEvent | KeyboardEvent) => {
      if (e instanceof KeyboardEvent ? e.key === 'Escape' : !ref.current?.contains(e.target as Node)) setOpen(false);
    };
    document.addEventListener('mousedown', close);
    document.addEventListener('keydown', close);
    return () => {
      document.removeEventListener('mousedown', close);
      document.removeEventListener('keydown', close);
    };
  }, [open]);
  return (
    <div className="relative" ref={ref}>
      <Button
        variant="ghost"
        size="bare"
        aria-haspopup="menu"
        aria-expanded={open}
        onClick={() => setOpen((v) => !v)}
        className="flex h-8 items-center gap-2 rounded-[3px] px-2 text-[13px]"
      >
        <span aria-hidden="true" className="grid size-6 place-items-center rounded-full bg-wash text-[11px] font-semibold">
          {name.slice(0, 1).toUpperCase()}
        </span>
        <span className="sr-only sm:not-sr-only">{name}</span>
      </Button>
      {open ? (
        <div role="menu" className="absolute right-0 z-30 mt-1 w-56 rounded-[4px] border border-rule bg-chalk p-1 shadow-lg">
          <div className="px-2 py-1.5 text-[12px] text-slate">{email}</div>
          <a role="menuitem" href="/team" className="block rounded-[3px] px-2 py-1.5 text-[13px] hover:bg-wash">
            Team and members
          </a>
          {/* A menu item beside a link item: it keeps the menu's row look, not a button's. */}
          <button
            role="menuitem"
            type="button"
            // next-auth's client (about 9 kB compressed) loads only when someone signs out.
            onClick={() => void import('next-auth/react').then(({ signOut }) => signOut({ callbackUrl: '/sign-in' }))}
            className="block w-full rounded-[3px] px-2 py-1.5 text-left text-[13px] hover:bg-wash"
          >
            Sign out
          </button>
        </div>
      ) : null}
    </div>
  );
}
