import type { ReactNode } from 'react';

/** An error announced to assistive technology, with a mark and words (never colour alone). */
export function ErrorText({
  children,
  id,
  size = 'md',
  className = '',
}: {
  children: ReactNode;
  id?: string;
  size?: 'sm' | 'md' | 'inherit';
  className?: string;
}) {
  const text = size === 'sm' ? 'text-[12px]' : size === 'md' ? 'text-[13px]' : '';
  return (
    <p id={id} role="alert" className={`${className} ${text} text-oxide`.trim()}>
      <span aria-hidden="true">✕ </span>
      {children}
    </p>
  );
}
