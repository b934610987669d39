"use client";

import { useEffect } from "react";

/**
 * Registers public/sw.js, which keeps a copy of this form and its assets so the form opens at the bench with no
 * connection. Service workers exist only in secure contexts (https, localhost); elsewhere the form still queues
 * what it cannot send, but needs the connection to open.
 */
export function ServiceWorkerRegistration() {
  useEffect(() => {
    if (!("serviceWorker" in navigator)) return;
    navigator.serviceWorker.register("/sw.js", { scope: "/" }).catch(() => {
      // Without it the form only fails to open offline; logging online and the queue work the same.
    });
  }, []);
  return null;
}
