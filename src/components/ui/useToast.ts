import { useContext } from 'react';
import { ToastContext, type ToastApi } from './ToastContext';

/** Show success, error and info toasts: `const toast = useToast(); toast.success('Report sent')`. */
export function useToast(): ToastApi {
  const api = useContext(ToastContext);
  if (!api) throw new Error('useToast must be used inside <ToastProvider>.');
  return api;
}
