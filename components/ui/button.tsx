import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'danger' | 'ghost';

const VARIANTS: Record<Variant, string> = {
  primary: 'bg-accent text-white hover:bg-accent-strong border-accent',
  secondary: 'bg-panel text-ink hover:bg-paper border-rule-strong',
  danger: 'bg-panel text-bad hover:bg-bad-soft border-bad/40',
  ghost: 'bg-transparent text-ink-muted hover:text-ink hover:bg-rule/40 border-transparent',
};

export function buttonClass(variant: Variant = 'primary', extra = ''): string {
  return `inline-flex items-center justify-center gap-1.5 rounded-md border px-3 py-1.5 text-sm font-medium no-underline transition-colors disabled:cursor-not-allowed disabled:opacity-50 ${VARIANTS[variant]} ${extra}`;
}

export function Button({ variant = 'primary', className = '', ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return <button className={buttonClass(variant, className)} {...props} />;
}
