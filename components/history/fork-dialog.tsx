'use client';

import { useRouter } from 'next/navigation';
import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { Field } from '@/components/ui/field';
import { ErrorText } from '@/components/ui/error-text';
import { apiFetch, failureOf } from '@/lib/api-client';

/** Forks a sheet for a new site: title and site; the fork starts from the chosen (default: newest) revision. */
export function ForkDialog({
  open,
  onClose,
  sheetId,
  sourceTitle,
  revision,
  teams,
}: {
  open: boolean;
  onClose: () => void;
  sheetId: string;
  sourceTitle: string;
  revision?: number;
  /** Teams where the user may create sheets; the first is the default. */
  teams?: { id: string; name: string }[];
}) {
  const router = useRouter();
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [pending, setPending] = useState(false);

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const siteName = String(form.get('siteName') ?? '').trim();
    const lat = String(form.get('latitude') ?? '').trim();
    const lon = String(form.get('longitude') ?? '').trim();
    const notes = String(form.get('siteNotes') ?? '').trim();
    const coordinate = (text: string) => (Number.isFinite(Number(text.replace(',', '.'))) ? Number(text.replace(',', '.')) : text);
    const body = {
      title: String(form.get('title') ?? ''),
      ...(siteName
        ? {
            site: {
              name: siteName,
              ...(lat ? { latitude: coordinate(lat) } : {}),
              ...(lon ? { longitude: coordinate(lon) } : {}),
              ...(notes ? { notes } : {}),
            },
          }
        : {}),
      ...(revision ? { revision } : {}),
      ...(form.get('teamId') ? { teamId: String(form.get('teamId')) } : {}),
    };
    setPending(true);
    setErrors({});
    let failure: { message: string; field?: string };
    try {
      const created = await apiFetch<{ sheet: { id: string } }>(`/api/sheets/${sheetId}/fork`, { body });
      setPending(false);
      onClose();
      router.push(`/sheets/${created.sheet.id}`);
      return;
    } catch (error) {
      setPending(false);
      failure = failureOf(error, 'The fork could not be made.');
    }
    const field = failure.field ?? 'form';
    const key = field.startsWith('site.name')
      ? 'siteName'
      : field.startsWith('site.latitude')
        ? 'latitude'
        : field.startsWith('site.longitude')
          ? 'longitude'
          : field.startsWith('site.notes')
            ? 'siteNotes'
            : field;
    setErrors({ [key]: failure.message.replace(/^[\w.]+: /, '') });
  }

  return (
    <Dialog open={open} onClose={onClose} title="Fork for a new site">
      <form onSubmit={onSubmit} className="flex flex-col gap-3" noValidate>
        <p className="text-[13px] text-slate">
          A copy of “{sourceTitle}”{revision ? ` at revision ${revision}` : ''} as a new draft that remembers where it came from.
        </p>
        <Field label="Title" name="title" required defaultValue={`${sourceTitle} (copy)`} error={errors.title} />
        <Field label="Site" name="siteName" error={errors.siteName} hint="Leave empty to keep the source's site." />
        <div className="grid grid-cols-2 gap-2">
          <Field label="Latitude" name="latitude" inputMode="decimal" error={errors.latitude} />
          <Field label="Longitude" name="longitude" inputMode="decimal" error={errors.longitude} />
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor="fork-site-notes" className="text-[13px] font-medium">
            Site notes
          </label>
          <textarea
            id="fork-site-notes"
            name="siteNotes"
            rows={2}
            maxLength={5000}
            aria-invalid={errors.siteNotes ? true : undefined}
            className="rounded-[3px] border border-rule bg-chalk px-2.5 py-1.5 text-[14px]"
          />
          {errors.siteNotes ? (
            <ErrorText size="sm">{errors.siteNotes}</ErrorText>
          ) : null}
        </div>
        {teams && teams[0] && teams.length > 1 ? (
          <label className="flex flex-col gap-1 text-[13px]">
            <span className="font-medium">Team</span>
            <select name="teamId" defaultValue={teams[0].id} className="h-9 rounded-[3px] border border-rule bg-chalk px-2">
              {teams.map((t) => <option key={t.id} value={t.id}>{t.name}</option>)}
            </select>
          </label>
        ) : null}
        {errors.form || errors.revision || errors.teamId ? (
          <ErrorText>{errors.form ?? errors.revision ?? errors.teamId}</ErrorText>
        ) : null}
        <div className="flex justify-end gap-2">
          <Button onClick={onClose}>Cancel</Button>
          <Button type="submit" variant="primary" disabled={pending}>{pending ? 'Forking…' : 'Fork'}</Button>
        </div>
      </form>
    </Dialog>
  );
}
