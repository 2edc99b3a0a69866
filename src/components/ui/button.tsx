import type { ComponentProps, ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { cx } from './cx';
import { Spinner } from './spinner';

type Variant = 'primary' | 'secondary' | 'danger' | 'quiet' | 'on-dark';
type Size = 'md' | 'lg';

const variants: Record<Variant, string> = {
  primary: 'bg-fjord-700 text-white hover:bg-fjord-800 active:bg-fjord-900 border-2 border-fjord-700',
  secondary: 'bg-white text-ink-950 border-2 border-ink-950 hover:bg-ink-50 active:bg-ink-100',
  danger: 'bg-alarm-700 text-white border-2 border-alarm-700 hover:brightness-95 active:brightness-90',
  quiet: 'bg-transparent text-fjord-700 border-2 border-transparent hover:bg-fjord-50 underline-offset-4',
  'on-dark': 'bg-transparent text-white border-2 border-ink-400 hover:border-lime-400 hover:text-lime-300',
};

const sizes: Record<Size, string> = {
  md: 'min-h-touch px-4 text-base',
  lg: 'min-h-touch-lg px-6 text-lg',
};

export function buttonClasses({ variant = 'primary', size = 'md' }: { variant?: Variant; size?: Size } = {}) {
  return cx(
    'inline-flex items-center justify-center gap-2 rounded-md font-semibold select-none transition-colors',
    'disabled:cursor-not-allowed disabled:opacity-60',
    variants[variant],
    sizes[size],
  );
}

type ButtonProps = ComponentProps<'button'> & {
  variant?: Variant;
  size?: Size;
  /** Shows a spinner, swaps the label for `pendingLabel` and blocks a second press. */
  pending?: boolean;
  pendingLabel?: ReactNode;
};

export function Button({
  variant,
  size,
  pending = false,
  pendingLabel,
  className,
  children,
  disabled,
  type = 'button',
  ...props
}: ButtonProps) {
  return (
    <button
      type={type}
      className={cx(buttonClasses({ variant, size }), className)}
      disabled={disabled || pending}
      aria-busy={pending || undefined}
      {...props}
    >
      {pending && <Spinner />}
      {pending && pendingLabel ? pendingLabel : children}
    </button>
  );
}

type ButtonLinkProps = ComponentProps<typeof Link> & { variant?: Variant; size?: Size };

export function ButtonLink({ variant, size, className, ...props }: ButtonLinkProps) {
  return <Link className={cx(buttonClasses({ variant, size }), className)} {...props} />;
}
