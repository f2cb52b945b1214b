import type { ButtonHTMLAttributes, ReactNode } from 'react';
import Link from 'next/link';

type Variant = 'primary' | 'secondary' | 'danger' | 'ghost';

const VARIANTS: Record<Variant, string> = {
  primary: 'bg-verdigris text-surface hover:bg-verdigris-strong border-transparent',
  secondary: 'bg-surface text-ink border-line hover:bg-sunken',
  danger: 'bg-surface text-signal border-signal/50 hover:bg-signal-soft',
  ghost: 'bg-transparent text-ink border-transparent hover:bg-sunken',
};

export function buttonClass(variant: Variant = 'primary', extra = ''): string {
  return `inline-flex items-center justify-center gap-2 rounded-plate border px-4 py-2 text-sm font-semibold transition-colors disabled:cursor-not-allowed disabled:opacity-60 ${VARIANTS[variant]} ${extra}`;
}

export function Button({
  variant = 'primary',
  className = '',
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return <button {...props} className={buttonClass(variant, className)} />;
}

export function ButtonLink({
  href,
  variant = 'primary',
  className = '',
  children,
}: {
  href: string;
  variant?: Variant;
  className?: string;
  children: ReactNode;
}) {
  return (
    <Link href={href} className={buttonClass(variant, className)}>
      {children}
    </Link>
  );
}
