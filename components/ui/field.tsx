import type { InputHTMLAttributes, ReactNode } from 'react';
import { ErrorText } from './error-text';

/** A labelled input with its help and its error, tied together for assistive technology. */
export function Field({
  label,
  name,
  error,
  hint,
  ...input
}: InputHTMLAttributes<HTMLInputElement> & { label: ReactNode; name: string; error?: string; hint?: ReactNode }) {
  const describedBy = [hint ? `${name}-hint` : null, error ? `${name}-error` : null].filter(Boolean).join(' ') || undefined;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={name} className="text-[13px] font-medium">
        {label}
      </label>
      <input
        id={name}
        name={name}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        className={`h-9 rounded-[3px] border bg-chalk px-2.5 text-[14px] ${error ? 'border-oxide' : 'border-rule'}`}
        {...input}
      />
      {hint ? (
        <p id={`${name}-hint`} className="text-[12px] text-slate">
          {hint}
        </p>
      ) : null}
      {error ? (
        <ErrorText id={`${name}-error`} size="sm">
          {error}
        </ErrorText>
      ) : null}
    </div>
  );
}
