import { createContext } from 'react';
import type { ReactNode } from 'react';

export type ToastKind = 'success' | 'error' | 'info';

export interface ToastOptions {
  /** Second line under the message. */
  description?: ReactNode;
  /** Milliseconds before it hides; null keeps it until dismissed. Default 5 s, errors 8 s. */
  duration?: number | null;
  /** One optional action, e.g. "Undo" or "View report". */
  action?: { label: string; onClick: () => void };
}

export interface ToastInput extends ToastOptions {
  kind: ToastKind;
  message: ReactNode;
}

export interface ToastApi {
  /** Show a toast; returns its id. */
  show: (toast: ToastInput) => string;
  success: (message: ReactNode, options?: ToastOptions) => string;
  error: (message: ReactNode, options?: ToastOptions) => string;
  info: (message: ReactNode, options?: ToastOptions) => string;
  dismiss: (id: string) => void;
}

export const ToastContext = createContext<ToastApi | null>(null);
