import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'quiet' | 'danger';

const VARIANTS: Record<Variant, string> = {
  primary: 'bg-river text-river-ink hover:opacity-90 border border-river',
  quiet: 'bg-chalk text-basalt border border-rule hover:bg-wash',
  danger: 'bg-chalk text-oxide border border-oxide/60 hover:bg-wash',
};

export function Button({
  variant = 'quiet',
  className = '',
  type = 'button',
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      type={type}
      className={`inline-flex h-8 items-center gap-1.5 rounded-[3px] px-3 text-[13px] font-medium disabled:cursor-not-allowed disabled:opacity-50 ${VARIANTS[variant]} ${className}`}
      {...props}
    />
  );
}
