import type { ButtonHTMLAttributes } from 'react';
import { Link, type LinkProps } from 'react-router';
import { Spinner } from './spinner';

type Variant = 'primary' | 'secondary' | 'danger' | 'ghost';
type Size = 'sm' | 'md';

const variants: Record<Variant, string> = {
  primary: 'bg-primary-700 text-white hover:bg-primary-800 border-primary-800 disabled:bg-primary-400 disabled:border-primary-400',
  secondary: 'bg-white text-slate-800 hover:bg-slate-50 border-slate-300 disabled:text-slate-400',
  danger: 'bg-white text-red-800 hover:bg-red-50 border-red-300 disabled:text-red-300',
  ghost: 'bg-transparent text-slate-700 hover:bg-slate-100 border-transparent disabled:text-slate-400',
};
const sizes: Record<Size, string> = {
  sm: 'px-2 py-1 text-xs gap-1',
  md: 'px-3 py-1.5 text-sm gap-1.5',
};

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: Variant;
  size?: Size;
  /** Shows a spinner and disables the button while a request runs. */
  pending?: boolean;
}

/** The app's button. `type` defaults to "button" so a stray button never submits a form. */
export function Button({ variant = 'secondary', size = 'md', pending = false, className = '', type = 'button', disabled, children, ...rest }: ButtonProps) {
  return (
    <button
      type={type}
      disabled={disabled || pending}
      aria-busy={pending || undefined}
      className={`inline-flex items-center justify-center rounded border font-medium whitespace-nowrap transition-colors disabled:cursor-not-allowed ${variants[variant]} ${sizes[size]} ${className}`}
      {...rest}
    >
      {pending && <Spinner className="size-3.5" />}
      {children}
    </button>
  );
}

/** A link that looks like a button, for actions that open another page ("New exposure group"). */
export function ButtonLink({ variant = 'secondary', size = 'md', className = '', ...rest }: LinkProps & { variant?: Variant; size?: Size }) {
  return (
    <Link
      className={`inline-flex items-center justify-center rounded border font-medium whitespace-nowrap no-underline transition-colors hover:no-underline ${variants[variant]} ${sizes[size]} ${className}`}
      {...rest}
    />
  );
}
