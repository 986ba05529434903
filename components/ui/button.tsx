import type { ComponentProps } from 'react';

/**
 * The one button of the product. `variant` is its colour and border, `size` its height, padding and shape.
 * Classes are not merged: a `className` adds layout (margins, self-alignment) or, with `size="bare"`, the
 * whole shape of a one-off button; it should not repeat a property the variant or size already sets.
 * React 19 passes `ref` as a prop, so a caller can focus it.
 */
export type ButtonVariant =
  /** The main action of a place (river). */
  | 'primary'
  /** An ordinary action: chalk with a rule border. */
  | 'quiet'
  /** A deletion. */
  | 'danger'
  /** Like quiet in slate text (secondary actions beside text: "Commands", "Edit note"). */
  | 'outline'
  /** Adds something to a list ("+ Add parameter"). */
  | 'dashed'
  /** Only a wash on hover (menu triggers, count badges); text colour from the context or `className`. */
  | 'ghost'
  /** A small tool: slate glyph, wash on hover. */
  | 'tool'
  /** A tool that deletes: turns oxide on hover. */
  | 'tool-danger'
  /** A link-like action in river. */
  | 'link'
  /** Text that underlines on hover, colour from the context. */
  | 'text'
  /** Slate text that darkens on hover ("Dismiss"). */
  | 'subtle';

export type ButtonSize =
  /** 32 px high, 13 px text. */
  | 'md'
  /** 28 px high, 12 px text. */
  | 'sm'
  /** A 28 px square for a glyph: needs an `aria-label`. */
  | 'icon'
  /** A 32 px square for a glyph: needs an `aria-label`. */
  | 'icon-lg'
  /** No box: for link, text and subtle buttons inside text. */
  | 'inline'
  /** Nothing: `className` gives the shape. */
  | 'bare';

const VARIANTS: Record<ButtonVariant, string> = {
  primary: 'bg-river text-river-ink hover:opacity-90 border border-river',
  quiet: 'bg-chalk text-basalt border border-rule hover:bg-wash',
  danger: 'bg-chalk text-oxide border border-oxide/60 hover:bg-wash',
  outline: 'bg-chalk text-slate border border-rule hover:text-basalt',
  dashed: 'border border-dashed border-rule text-slate hover:text-basalt',
  ghost: 'hover:bg-wash',
  tool: 'text-slate hover:bg-wash hover:text-basalt disabled:hover:bg-transparent',
  'tool-danger': 'text-slate hover:bg-wash hover:text-oxide disabled:hover:bg-transparent',
  link: 'text-river underline-offset-2 hover:underline',
  text: 'underline-offset-2 hover:underline',
  subtle: 'text-slate hover:text-basalt',
};

const SIZES: Record<ButtonSize, string> = {
  md: 'inline-flex h-8 items-center gap-1.5 rounded-[3px] px-3 text-[13px] font-medium',
  sm: 'inline-flex h-7 items-center gap-1 rounded-[3px] px-2 text-[12px]',
  icon: 'grid size-7 place-items-center rounded-[3px]',
  'icon-lg': 'grid size-8 place-items-center rounded-[3px]',
  inline: 'rounded-[2px]',
  bare: '',
};

type CommonProps = Omit<ComponentProps<'button'>, 'type'> & {
  type?: 'button' | 'submit' | 'reset';
  variant?: ButtonVariant;
};

/** An icon-only button must say what it does. */
export type ButtonProps =
  | (CommonProps & { size?: Exclude<ButtonSize, 'icon' | 'icon-lg'> })
  | (CommonProps & { size: 'icon' | 'icon-lg'; 'aria-label': string });

export function Button({ variant = 'quiet', size = 'md', className = '', type = 'button', ...props }: ButtonProps) {
  const classes = [SIZES[size], VARIANTS[variant], 'disabled:cursor-not-allowed disabled:opacity-50', className].filter(Boolean).join(' ');
  return <button type={type} className={classes} {...props} />;
}
