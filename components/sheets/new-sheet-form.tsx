'use client';

import { useActionState, useState } from 'react';
import { createSheetAction, type CreateSheetState } from '@/app/(workspace)/sheets/actions';
import { Button } from '@/components/ui/button';

export function NewSheetForm() {
  const [open, setOpen] = useState(false);
  const [state, action, pending] = useActionState<CreateSheetState, FormData>(createSheetAction, {});
  if (!open) {
    return (
      <Button variant="primary" onClick={() => setOpen(true)}>
        New sheet
      </Button>
    );
  }
  return (
    <form action={action} className="flex flex-wrap items-start gap-2 rounded-[4px] border border-rule bg-chalk p-3" aria-label="New sheet">
      <label className="flex flex-col gap-1 text-[12px]">
        Title
        <input
          name="title"
          required
          autoFocus
          aria-invalid={state.errors?.title ? true : undefined}
          className="h-8 w-64 rounded-[3px] border border-rule bg-chalk px-2 text-[13px]"
        />
        {state.errors?.title ? <span role="alert" className="text-oxide">{state.errors.title}</span> : null}
      </label>
      <label className="flex flex-col gap-1 text-[12px]">
        Site (optional)
        <input name="siteName" className="h-8 w-56 rounded-[3px] border border-rule bg-chalk px-2 text-[13px]" />
        {state.errors?.siteName ? <span role="alert" className="text-oxide">{state.errors.siteName}</span> : null}
      </label>
      <div className="flex gap-2 self-end">
        <Button variant="primary" type="submit" disabled={pending}>
          {pending ? 'Creating…' : 'Create'}
        </Button>
        <Button onClick={() => setOpen(false)}>Cancel</Button>
      </div>
      {state.errors?.form ? <p role="alert" className="w-full text-[12px] text-oxide">{state.errors.form}</p> : null}
    </form>
  );
}
