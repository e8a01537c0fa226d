'use client';

import { useEffect } from 'react';

export const LEAVE_MESSAGE = 'This design has unsaved changes. Leave and lose them?';

/** Marks the extra history entry the guard pushes, so a second arming does not push another. */
const SENTINEL = 'phasewrightLeaveGuard';

/**
 * While `active`, asks before the page is left: the browser's own prompt on
 * reload/close, a confirm() before following an in-app link (caught in the
 * capture phase, before Next's Link handles the click), and a confirm() on
 * the browser's back button.
 *
 * Back: a history entry for the same URL is pushed while there are unsaved
 * changes, so Back first lands on the page itself (popstate, nothing is
 * unloaded). Then we ask: "leave" goes back once more for real, "stay"
 * pushes the entry again. The entry is left in place once the changes are
 * saved (taking it out would be one more history move racing the refresh).
 */
export function useLeaveGuard(active: boolean) {
  useEffect(() => {
    if (!active) return;
    let leaving = false;
    let armed = false;
    const arm = () => {
      // No URL: Next's patched pushState copies its own state into the entry and does not navigate.
      window.history.pushState({ [SENTINEL]: true }, '');
      armed = true;
    };
    if (window.history.state?.[SENTINEL]) armed = true;
    else arm();

    const onPopState = () => {
      // The guard's entry is the newest one, so leaving it is always a step back.
      if (!armed || leaving) return;
      armed = false;
      if (window.confirm(LEAVE_MESSAGE)) {
        leaving = true;
        window.history.back();
      } else {
        arm();
      }
    };
    const onBeforeUnload = (e: BeforeUnloadEvent) => {
      if (leaving) return;
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
    window.addEventListener('popstate', onPopState);
    window.addEventListener('beforeunload', onBeforeUnload);
    document.addEventListener('click', onClick, true);
    return () => {
      window.removeEventListener('popstate', onPopState);
      window.removeEventListener('beforeunload', onBeforeUnload);
      document.removeEventListener('click', onClick, true);
    };
  }, [active]);
}
