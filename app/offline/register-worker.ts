// Registers the service worker that keeps the app's shell and kept plans for use without signal.
// Service workers need a secure context: https, or http on localhost / 127.0.0.1.
export function registerWorker() {
  if (typeof navigator === "undefined" || !("serviceWorker" in navigator) || !window.isSecureContext) return;
  navigator.serviceWorker.register("/sw.js", { scope: "/" }).catch(() => {
    // Without the worker the app still works with signal; the kept plans are simply not available offline.
  });
}
