import type { ReactNode } from 'react';
import { Badge, type BadgeTone } from './Badge';
import { Icon, type IconName } from './Icon';

/** The states a thing can be in, each with its own shape as well as its own colour. */
export type Status = 'ok' | 'warning' | 'error' | 'pending' | 'processing' | 'info' | 'neutral';

const statusLook: Record<Status, { tone: BadgeTone; icon: IconName; spin?: boolean }> = {
  ok: { tone: 'gain', icon: 'circle-check' },
  warning: { tone: 'warn', icon: 'triangle' },
  error: { tone: 'loss', icon: 'octagon' },
  pending: { tone: 'neutral', icon: 'clock' },
  processing: { tone: 'info', icon: 'circle-dashed', spin: true },
  info: { tone: 'info', icon: 'circle-info' },
  neutral: { tone: 'neutral', icon: 'circle-open' },
};

export interface StatusBadgeProps {
  status: Status;
  /** The words, e.g. "Processed", "Check file", "Rejected". Required: the shape and colour only support them. */
  children: ReactNode;
  className?: string;
}

/** A status shown as text with a distinct shape: check, triangle, octagon, clock, dashed ring. */
export function StatusBadge({ status, children, className }: StatusBadgeProps) {
  const look = statusLook[status];
  return (
    <Badge
      tone={look.tone}
      className={className}
      icon={<Icon name={look.icon} size={16} className={look.spin ? 'motion-safe:animate-spin' : undefined} />}
    >
      {children}
    </Badge>
  );
}
