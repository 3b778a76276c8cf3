import type { ButtonHTMLAttributes, ReactNode } from 'react';
import { Link, type LinkProps } from 'react-router';

const VARIANTS = {
  primary: 'bg-tide-800 text-white hover:bg-tide-600 disabled:bg-tide-400',
  secondary: 'border border-tide-200 bg-white text-tide-800 hover:bg-tide-50',
  danger: 'border border-eol-600/40 bg-white text-eol-600 hover:bg-eol-600/5',
  ghost: 'text-tide-800 hover:bg-tide-100',
} as const;

export type ButtonVariant = keyof typeof VARIANTS;

/** The look of every button and button-like link: at least 40 px tall for a thumb. */
export function buttonClass(variant: ButtonVariant = 'secondary', size: 'md' | 'sm' = 'md'): string {
  const sizing = size === 'sm' ? 'min-h-9 px-3 py-1.5 text-sm' : 'min-h-10 px-4 py-2 text-sm';
  return `inline-flex items-center justify-center gap-2 rounded-lg font-medium transition disabled:cursor-not-allowed disabled:opacity-60 ${sizing} ${VARIANTS[variant]}`;
}

export function Button({
  variant = 'secondary',
  size = 'md',
  className = '',
  type = 'button',
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: ButtonVariant; size?: 'md' | 'sm' }) {
  return <button type={type} className={`${buttonClass(variant, size)} ${className}`} {...props} />;
}

/** A link that looks like a button (navigation, not an action). */
export function ButtonLink({
  variant = 'secondary',
  size = 'md',
  className = '',
  children,
  ...props
}: LinkProps & { variant?: ButtonVariant; size?: 'md' | 'sm'; children: ReactNode }) {
  return (
    <Link className={`${buttonClass(variant, size)} ${className}`} {...props}>
      {children}
    </Link>
  );
}
