import { useEffect } from 'react';
import { useUi, uiStore } from '../state/ui';

export function Toast() {
  const toast = useUi((s) => s.toast);
  useEffect(() => {
    if (!toast) return;
    const t = setTimeout(() => uiStore.getState().set({ toast: null }), 4000);
    return () => clearTimeout(t);
  }, [toast]);
  return <div className="lf-toast" role="status" aria-live="polite">{toast}</div>;
}
