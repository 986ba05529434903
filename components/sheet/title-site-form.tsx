'use client';

import { useEffect, useRef, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { readTitleSite, type TitleSiteErrors as Errors } from '@/lib/sheet/title-site';
import type { SiteInfo } from '@/lib/sheet/types';
import { ErrorText } from '@/components/ui/error-text';

/** Edits the sheet's title and site in the header; saved with the draft (the sheet row follows it). */
export function TitleSiteForm({
  title,
  site,
  onSave,
  onCancel,
}: {
  title: string;
  site?: SiteInfo;
  onSave: (title: string, site: SiteInfo | undefined) => void;
  onCancel: () => void;
}) {
  const [errors, setErrors] = useState<Errors>({});
  const formRef = useRef<HTMLFormElement>(null);
  useEffect(() => {
    formRef.current?.querySelector<HTMLInputElement>('input')?.focus();
  }, []);

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const read = readTitleSite({
      title: String(form.get('sheet-title') ?? ''),
      name: String(form.get('sheet-site-name') ?? ''),
      latitude: String(form.get('sheet-site-latitude') ?? ''),
      longitude: String(form.get('sheet-site-longitude') ?? ''),
      notes: String(form.get('sheet-site-notes') ?? ''),
    });
    setErrors(read.errors);
    if (read.title !== undefined && Object.keys(read.errors).length === 0) onSave(read.title, read.site);
  }

  return (
    <form
      ref={formRef}
      onSubmit={submit}
      onKeyDown={(e) => {
        if (e.key === 'Escape') {
          e.preventDefault();
          e.stopPropagation();
          onCancel();
        }
      }}
      noValidate
      aria-label="Title and site"
      className="flex flex-col gap-3 rounded-[4px] border border-rule bg-chalk p-3"
    >
      <Field label="Title" name="sheet-title" defaultValue={title} maxLength={200} required error={errors.title} />
      <div className="grid gap-3 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)_minmax(0,1fr)]">
        <Field label="Site" name="sheet-site-name" defaultValue={site?.name ?? ''} maxLength={200} error={errors.name} hint="Leave empty for no site." />
        <Field
          label="Latitude"
          name="sheet-site-latitude"
          inputMode="decimal"
          defaultValue={site?.latitude ?? ''}
          error={errors.latitude}
          hint="Decimal degrees, north positive"
        />
        <Field
          label="Longitude"
          name="sheet-site-longitude"
          inputMode="decimal"
          defaultValue={site?.longitude ?? ''}
          error={errors.longitude}
          hint="Decimal degrees, east positive"
        />
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor="sheet-site-notes" className="text-[13px] font-medium">
          Site notes
        </label>
        <textarea
          id="sheet-site-notes"
          name="sheet-site-notes"
          defaultValue={site?.notes ?? ''}
          rows={3}
          maxLength={5000}
          aria-invalid={errors.notes ? true : undefined}
          aria-describedby={errors.notes ? 'sheet-site-notes-error' : undefined}
          className="rounded-[3px] border border-rule bg-chalk px-2.5 py-1.5 text-[14px]"
        />
        {errors.notes ? (
          <ErrorText id="sheet-site-notes-error" size="sm">
            {errors.notes}
          </ErrorText>
        ) : null}
      </div>
      <div className="flex justify-end gap-2">
        <Button onClick={onCancel}>Cancel</Button>
        <Button type="submit" variant="primary">
          Save title and site
        </Button>
      </div>
    </form>
  );
}
