import type { ReactNode } from 'react';
import { cn } from './cn';
import { toneSoftClass, type Tone } from './styles';

export type BadgeTone = Tone;

export interface BadgeProps {
  tone?: BadgeTone;
  /** Icon or shape before the text, so the tone is never carried by colour alone. */
  icon?: ReactNode;
  children: ReactNode;
  className?: string;
}

/** A small label. Always has text; colour only reinforces it. */
export function Badge({ tone = 'neutral', icon, children, className }: BadgeProps) {
  return (
    <span
      className={cn(
        'inline-flex items-center gap-1 whitespace-nowrap rounded-full border px-2.5 py-0.5 text-sm font-medium leading-5',
        toneSoftClass[tone],
        className,
      )}
    >
      {icon}
      {children}
    </span>
  );
}
