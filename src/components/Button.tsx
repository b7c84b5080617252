import type { ButtonHTMLAttributes, Ref } from 'react';

type Variant = 'primary' | 'secondary' | 'danger' | 'quiet';
type Size = 'sm' | 'md' | 'lg';

const VARIANTS: Record<Variant, string> = {
  primary: 'bg-copper-600 text-white hover:bg-copper-700 active:bg-copper-800 disabled:bg-graphite-300',
  secondary: 'bg-white text-graphite-900 border border-graphite-300 hover:bg-graphite-100 disabled:text-graphite-400',
  danger: 'bg-white text-fault border border-fault/60 hover:bg-fault-soft disabled:text-graphite-400 disabled:border-graphite-200',
  quiet: 'bg-transparent text-graphite-700 hover:bg-graphite-100 disabled:text-graphite-400',
};
const SIZES: Record<Size, string> = {
  sm: 'h-7 px-2.5 text-sm',
  md: 'h-10 px-4 text-[0.95rem]',
  lg: 'h-12 px-6 text-base',
};

export function buttonClass(variant: Variant = 'secondary', size: Size = 'md', extra = '') {
  return `inline-flex items-center justify-center gap-2 rounded-md font-semibold whitespace-nowrap transition-colors disabled:cursor-not-allowed ${VARIANTS[variant]} ${SIZES[size]} ${extra}`;
}

export type ButtonProps = ButtonHTMLAttributes<HTMLButtonElement> & {
  variant?: Variant;
  size?: Size;
  busy?: boolean;
  ref?: Ref<HTMLButtonElement>;
};

export function Button({ variant = 'secondary', size = 'md', busy, className = '', children, disabled, type = 'button', ...rest }: ButtonProps) {
  return (
    <button type={type} className={buttonClass(variant, size, className)} disabled={disabled || busy} aria-busy={busy || undefined} {...rest}>
      {busy && <span aria-hidden className="size-3.5 animate-spin rounded-full border-2 border-current border-r-transparent" />}
      {children}
    </button>
  );
}
