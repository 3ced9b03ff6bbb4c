import type { ButtonHTMLAttributes } from 'react';

const variants = {
  primary: 'bg-ember-700 text-white hover:bg-ember-800 disabled:bg-ember-200',
  secondary:
    'border border-soot-300 bg-white text-soot-800 hover:bg-soot-100 disabled:text-soot-500',
  danger: 'border border-red-300 bg-white text-red-800 hover:bg-red-50 disabled:text-soot-500',
  ghost: 'text-soot-700 hover:bg-soot-100',
} as const;

interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: keyof typeof variants;
  busy?: boolean;
}

export function Button({
  variant = 'primary',
  busy = false,
  className = '',
  children,
  disabled,
  type = 'button',
  ...props
}: ButtonProps) {
  return (
    <button
      type={type}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={`inline-flex items-center justify-center gap-2 rounded-md px-3.5 py-2 text-sm font-medium transition-colors disabled:cursor-not-allowed ${variants[variant]} ${className}`}
      {...props}
    >
      {busy ? (
        <span
          className="size-3.5 animate-spin rounded-full border-2 border-current border-t-transparent"
          aria-hidden
        />
      ) : null}
      {children}
    </button>
  );
}
