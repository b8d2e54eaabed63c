import type { ButtonHTMLAttributes, ReactNode, Ref } from 'react';
import { Link, type LinkProps } from 'react-router-dom';
import { SpinnerIcon } from './icons-start';

export type ButtonVariant = 'primary' | 'secondary' | 'quiet' | 'danger';
export type ButtonSize = 'md' | 'sm';

const base =
  'inline-flex items-center justify-center gap-2 rounded-lg font-medium transition-colors select-none ' +
  'disabled:cursor-not-allowed disabled:opacity-60 print:hidden';

const variants: Record<ButtonVariant, string> = {
  primary: 'bg-iris-700 text-white hover:bg-iris-800 active:bg-iris-900',
  secondary:
    'border border-paper-500 bg-white text-paper-900 hover:bg-paper-100 active:bg-paper-200',
  quiet: 'text-iris-700 hover:bg-iris-50 active:bg-iris-100 underline-offset-4 hover:underline',
  danger: 'bg-alarm-700 text-white hover:bg-alarm-800',
};

const sizes: Record<ButtonSize, string> = {
  md: 'min-h-tap px-4 py-2 text-base',
  sm: 'min-h-10 px-3 py-1.5 text-sm',
};

export function buttonClasses(
  variant: ButtonVariant = 'primary',
  size: ButtonSize = 'md',
  extra = '',
): string {
  return `${base} ${variants[variant]} ${sizes[size]} ${extra}`;
}

type ButtonProps = ButtonHTMLAttributes<HTMLButtonElement> & {
  variant?: ButtonVariant;
  size?: ButtonSize;
  /** Shows a spinner and blocks repeat presses while a request is on its way. */
  busy?: boolean;
  icon?: ReactNode;
  ref?: Ref<HTMLButtonElement>;
};

export function Button({
  variant = 'primary',
  size = 'md',
  busy = false,
  icon,
  className = '',
  children,
  disabled,
  type = 'button',
  ref,
  ...rest
}: ButtonProps) {
  return (
    <button
      ref={ref}
      type={type}
      className={buttonClasses(variant, size, className)}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      {...rest}
    >
      {busy ? <SpinnerIcon className="size-5" /> : icon}
      {children}
    </button>
  );
}

type LinkButtonProps = LinkProps & { variant?: ButtonVariant; size?: ButtonSize; icon?: ReactNode };

export function LinkButton({
  variant = 'secondary',
  size = 'md',
  icon,
  className = '',
  children,
  ...rest
}: LinkButtonProps) {
  return (
    <Link className={buttonClasses(variant, size, className)} {...rest}>
      {icon}
      {children}
    </Link>
  );
}
