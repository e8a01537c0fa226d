'use client';

import { useEffect } from 'react';

export const LEAVE_MESSAGE = 'This design has unsaved changes. Leave and lose them?';

/**
 * While `active`, asks before the page is left: the browser's own prompt on
 * reload/close, and a confirm() before following an in-app link (caught in
 * the capture phase, before Next's Link handles the click).
 */
export function useLeaveGuard(active: boolean) {
  useEffect(() => {
    if (!active) return;
    const onBeforeUnload = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      e.returnValue = '';
    };
    const onClick = (e: MouseEvent) => {
      if (e.defaultPrevented || e.button !== 0 || e.metaKey || e.ctrlKey || e.shiftKey || e.altKey) return;
      const a = (e.target as Element | null)?.closest?.('a[href]') as HTMLAnchorElement | null;
      if (!a || a.target === '_blank' || a.hasAttribute('download') || a.dataset.leaveOk !== undefined) return;
      const url = new URL(a.href, window.location.href);
      const here = new URL(window.location.href);
      if (url.origin === here.origin && url.pathname === here.pathname && url.search === here.search) return;
      if (!window.confirm(LEAVE_MESSAGE)) {
        e.preventDefault();
        e.stopPropagation();
      }
    };
    window.addEventListener('beforeunload', onBeforeUnload);
    document.addEventListener('click', onClick, true);
    return () => {
      window.removeEventListener('beforeunload', onBeforeUnload);
      document.removeEventListener('click', onClick, true);
    };
  }, [active]);
}
