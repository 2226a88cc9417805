import { Button as HeadlessButton, type ButtonProps as HeadlessButtonProps } from '@headlessui/react';

type Variant = 'primary' | 'secondary' | 'ghost';

const variantClasses: Record<Variant, string> = {
  primary: 'bg-accent-600 text-white data-hover:bg-accent-700 dark:data-hover:bg-accent-300',
  secondary: 'bg-surface text-ink-900 ring-1 ring-inset ring-line data-hover:bg-accent-50',
  ghost: 'text-ink-800 data-hover:bg-accent-50',
};

export type ButtonProps = Omit<HeadlessButtonProps, 'className'> & { variant?: Variant; className?: string };

/** Headless UI's Button (hover/focus/active as data attributes) in our colours. */
export function Button({ variant = 'primary', className = '', ...props }: ButtonProps) {
  return (
    <HeadlessButton
      {...props}
      className={`inline-flex items-center gap-2 rounded-md px-3.5 py-2 text-sm font-semibold transition-colors data-disabled:cursor-not-allowed data-disabled:opacity-60 data-focus:outline-3 data-focus:outline-offset-2 data-focus:outline-accent-600 ${variantClasses[variant]} ${className}`}
    />
  );
}
