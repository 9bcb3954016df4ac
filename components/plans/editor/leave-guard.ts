"use client";

import { useEffect, useRef } from "react";

/**
 * Warns before leaving a page with unsaved changes: the browser's own prompt on reload,
 * close and typed addresses (beforeunload), and `onAttempt(href)` for a click on a link to
 * another page of the app (in-app navigation), which is held until the caller decides.
 * While `dirty` is false nothing is intercepted.
 */
export function useLeaveGuard(dirty: boolean, onAttempt: (href: string) => void): void {
  const attempt = useRef(onAttempt);
  useEffect(() => {
    attempt.current = onAttempt;
  }, [onAttempt]);

  useEffect(() => {
    if (!dirty) return;
    const beforeUnload = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      // Chromium still wants returnValue set to show its prompt.
      e.returnValue = "";
    };
    const click = (e: MouseEvent) => {
      if (e.defaultPrevented || e.button !== 0 || e.metaKey || e.ctrlKey || e.shiftKey || e.altKey) return;
      const a = (e.target as Element | null)?.closest?.("a[href]");
      if (!(a instanceof HTMLAnchorElement) || a.target === "_blank" || a.hasAttribute("download")) return;
      const url = new URL(a.href, window.location.href);
      if (url.origin !== window.location.origin) return;
      if (url.pathname === window.location.pathname && url.search === window.location.search) return;
      e.preventDefault();
      e.stopPropagation();
      attempt.current(url.pathname + url.search + url.hash);
    };
    window.addEventListener("beforeunload", beforeUnload);
    document.addEventListener("click", click, true);
    return () => {
      window.removeEventListener("beforeunload", beforeUnload);
      document.removeEventListener("click", click, true);
    };
  }, [dirty]);
}
