import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'quiet' | 'danger';

const variants: Record<Variant, string> = {
  primary: 'bg-accent text-ink-950 hover:bg-accent-strong disabled:bg-accent-dim',
  quiet: 'bg-ink-800 text-mist-100 hover:bg-ink-700 disabled:text-mist-500',
  danger: 'bg-ink-800 text-danger hover:bg-ink-700 disabled:text-mist-500',
};

export function Button({
  variant = 'primary',
  className = '',
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      className={`inline-flex items-center justify-center gap-2 rounded-md px-3.5 py-2 text-sm font-medium transition-colors disabled:cursor-not-allowed ${variants[variant]} ${className}`}
      {...props}
    />
  );
}
