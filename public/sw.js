// Plumbline's service worker: keeps the app's shell and the plans a rigger keeps on the phone, so a plant room
// without signal still opens them. Hand-written, no build step: it is served as it is from /sw.js.
//   /assets/* (hashed, never change)   cache first, stored as fetched
//   the lift page, its data and PDF     network first; stored when opened or kept; the stored copy without signal
//   other pages                         network only; without signal the stored shell page (/offline.html)
//   anything else (POST, API)           straight to the network: work without signal is the page's to keep
const SHELL_CACHE = "plumbline-shell-v1";
const ASSET_CACHE = "plumbline-assets-v1";
const PAGE_CACHE = "plumbline-pages-v1";
const SHELL = ["/offline.html", "/offline.js", "/manifest.webmanifest", "/icon.svg", "/icon-192.png", "/favicon.svg"];
const KEPT_PATH = /^\/(plans\/\d+\/(lift|lift\.data|print\.pdf)|verify\/[A-Za-z0-9_-]+)$/;

self.addEventListener("install", (event) => {
  event.waitUntil(
    caches
      .open(SHELL_CACHE)
      .then((cache) => cache.addAll(SHELL))
      .then(() => self.skipWaiting()),
  );
});

self.addEventListener("activate", (event) => {
  const current = new Set([SHELL_CACHE, ASSET_CACHE, PAGE_CACHE]);
  event.waitUntil(
    caches
      .keys()
      .then((names) => Promise.all(names.filter((n) => n.startsWith("plumbline-") && !current.has(n)).map((n) => caches.delete(n))))
      .then(() => self.clients.claim()),
  );
});

async function assetFirst(request) {
  const cached = await caches.match(request);
  if (cached) return cached;
  const response = await fetch(request);
  if (response.ok) {
    const cache = await caches.open(ASSET_CACHE);
    await cache.put(request, response.clone());
  }
  return response;
}

/** The lift page, its data and its PDF: fresh from the server, kept for later; the kept copy without signal. */
async function keptPage(request, url) {
  const key = url.pathname;
  try {
    const response = await fetch(request);
    // Only a real answer replaces the kept copy: not a sign-in redirect or an error page.
    if (response.ok && !response.redirected) {
      const cache = await caches.open(PAGE_CACHE);
      await cache.put(key, response.clone());
    }
    return response;
  } catch (error) {
    const cached = await caches.match(key, { cacheName: PAGE_CACHE });
    if (cached) return cached;
    if (request.mode === "navigate") return offlineShell();
    throw error;
  }
}

/** Empties the phone's list of kept plans (the app's Dexie table "kept"); unsent work and drafts stay. */
function forgetKeptList() {
  return new Promise((resolve) => {
    const open = indexedDB.open("plumbline");
    open.onupgradeneeded = () => open.transaction.abort();
    open.onerror = () => resolve();
    open.onsuccess = () => {
      const db = open.result;
      if (!db.objectStoreNames.contains("kept")) return resolve(db.close());
      const tx = db.transaction("kept", "readwrite");
      tx.objectStore("kept").clear();
      tx.oncomplete = tx.onerror = () => resolve(db.close());
    };
  });
}

async function offlineShell() {
  const shell = await caches.match("/offline.html", { cacheName: SHELL_CACHE });
  return shell ?? new Response("No signal, and this page is not kept on this phone.", { status: 503 });
}

self.addEventListener("fetch", (event) => {
  const request = event.request;
  const url = new URL(request.url);
  if (url.origin !== self.location.origin) return;
  // Signing out forgets the kept pages: the next person on this phone does not see them.
  if (request.method === "POST" && url.pathname === "/logout") {
    event.waitUntil(Promise.all([caches.delete(PAGE_CACHE), forgetKeptList()]));
    return;
  }
  if (request.method !== "GET") return;
  if (url.pathname.startsWith("/assets/")) {
    event.respondWith(assetFirst(request));
    return;
  }
  if (KEPT_PATH.test(url.pathname)) {
    event.respondWith(keptPage(request, url));
    return;
  }
  if (SHELL.includes(url.pathname)) {
    event.respondWith(caches.match(url.pathname, { cacheName: SHELL_CACHE }).then((hit) => hit ?? fetch(request)));
    return;
  }
  if (request.mode === "navigate") {
    event.respondWith(fetch(request).catch(() => offlineShell()));
  }
});
