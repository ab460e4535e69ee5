import type { ButtonHTMLAttributes } from 'react';

const variants = {
  primary: 'bg-indigo text-white hover:bg-indigo-deep disabled:bg-indigo/50',
  secondary: 'bg-card text-indigo border-2 border-indigo hover:bg-linen-deep disabled:opacity-50',
  danger: 'bg-madder text-white hover:bg-madder-deep disabled:bg-madder/50',
  quiet: 'bg-transparent text-indigo underline underline-offset-4 hover:text-indigo-deep disabled:opacity-50',
} as const;

export type ButtonVariant = keyof typeof variants;

export function buttonClass(variant: ButtonVariant = 'primary', extra = '') {
  return `inline-flex min-h-11 items-center justify-center gap-2 rounded-lg px-5 py-2 font-semibold transition-colors disabled:cursor-not-allowed ${variants[variant]} ${extra}`;
}

interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: ButtonVariant;
  pending?: boolean;
  pendingLabel?: string;
}

/** A 44 px tap target; while `pending` it is disabled and says what it is doing. */
export function Button({
  variant = 'primary',
  pending,
  pendingLabel,
  className = '',
  children,
  disabled,
  type = 'button',
  ...rest
}: ButtonProps) {
  return (
    <button
      type={type}
      className={buttonClass(variant, className)}
      disabled={disabled || pending}
      aria-busy={pending || undefined}
      {...rest}
    >
      {pending ? (pendingLabel ?? 'Working…') : children}
    </button>
  );
}
