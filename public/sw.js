/*
 * Blockpost's service worker: keeps the app shell and its built assets so the intake view opens and
 * works in a hall without a network. API answers go to the network first; only the few the intake
 * view needs are kept as a fallback (who is signed in, the guild, a swap's intake pack), and they are
 * dropped at sign-out. Everything else from /api is never stored here.
 */
/* global self, caches, fetch, indexedDB, setTimeout, URL */
const VERSION = 'v1';
const SHELL = `blockpost-shell-${VERSION}`;
const ASSETS = `blockpost-assets-${VERSION}`;
const API = `blockpost-api-${VERSION}`;
const KEEP = [SHELL, ASSETS, API];

const SHELL_URLS = ['/', '/manifest.webmanifest', '/blockpost-mark.svg', '/icons/icon-192.png'];
const API_FALLBACK = [/^\/api\/session$/, /^\/api\/guilds\/\d+$/, /^\/api\/swaps\/\d+\/intake$/];

self.addEventListener('install', (event) => {
  event.waitUntil(
    caches
      .open(SHELL)
      .then((cache) => cache.addAll(SHELL_URLS))
      .then(() => self.skipWaiting()),
  );
});

self.addEventListener('activate', (event) => {
  event.waitUntil(
    caches
      .keys()
      .then((names) =>
        Promise.all(names.filter((n) => n.startsWith('blockpost-') && !KEEP.includes(n)).map((n) => caches.delete(n))),
      )
      .then(() => self.clients.claim()),
  );
});

/** Built files carry a content hash in their name, so a kept copy never goes stale. */
const isAsset = (url) => url.pathname.startsWith('/assets/');

async function cacheFirst(request, cacheName) {
  const kept = await caches.match(request);
  if (kept) return kept;
  const response = await fetch(request);
  if (response.ok) (await caches.open(cacheName)).put(request, response.clone());
  return response;
}

/**
 * The network's answer when it comes within `wait` ms, else the kept copy (a hall's Wi-Fi that is
 * connected but goes nowhere would otherwise hang the page); the network's answer still refreshes it.
 */
async function networkFirst(request, cacheName, key = request, wait = 4000) {
  const cache = await caches.open(cacheName);
  const network = fetch(request).then((response) => {
    // 204 (the session probe of a signed-out visitor) keeps nothing worth keeping.
    if (response.ok && response.status !== 204) cache.put(key, response.clone());
    return response;
  });
  network.catch(() => undefined); // a late failure after the kept copy answered is not an error
  const late = new Promise((resolve) => setTimeout(resolve, wait, null));
  try {
    const first = await Promise.race([network, late]);
    if (first) return first;
    return (await cache.match(key)) ?? (await network);
  } catch (error) {
    const kept = await cache.match(key);
    if (kept) return kept;
    throw error;
  }
}

/** Drops kept API answers and the intake packs (names of makers) when someone signs out. */
async function forgetPersonalData() {
  await caches.delete(API);
  await new Promise((resolve) => {
    const open = indexedDB.open('blockpost-intake');
    // No database yet: abort so that opening it here does not create an empty one.
    open.onupgradeneeded = () => open.transaction.abort();
    open.onerror = () => resolve();
    open.onsuccess = () => {
      const db = open.result;
      if (!db.objectStoreNames.contains('packs')) {
        db.close();
        return resolve();
      }
      const tx = db.transaction('packs', 'readwrite');
      tx.objectStore('packs').clear();
      tx.oncomplete = tx.onerror = () => {
        db.close();
        resolve();
      };
    };
  });
}

self.addEventListener('fetch', (event) => {
  const { request } = event;
  const url = new URL(request.url);
  if (url.origin !== self.location.origin) return;
  if (request.method === 'POST' && url.pathname === '/api/auth/logout') {
    event.waitUntil(forgetPersonalData());
    return;
  }
  if (request.method !== 'GET' || url.pathname.startsWith('/socket.io')) return;
  if (request.mode === 'navigate') {
    // Every page is the same app shell; keep the newest one under '/'.
    event.respondWith(networkFirst(request, SHELL, '/'));
    return;
  }
  if (url.pathname.startsWith('/api/')) {
    if (API_FALLBACK.some((re) => re.test(url.pathname))) event.respondWith(networkFirst(request, API));
    return;
  }
  if (isAsset(url)) {
    event.respondWith(cacheFirst(request, ASSETS));
    return;
  }
  if (SHELL_URLS.includes(url.pathname) || url.pathname.startsWith('/icons/')) event.respondWith(networkFirst(request, SHELL));
});

// The page lists what it loaded before this worker took control, so those files are kept too.
self.addEventListener('message', (event) => {
  const data = event.data;
  if (!data || data.type !== 'warm' || !Array.isArray(data.urls)) return;
  const urls = data.urls.filter((u) => {
    try {
      const url = new URL(u, self.location.origin);
      return url.origin === self.location.origin && isAsset(url);
    } catch {
      return false;
    }
  });
  event.waitUntil(
    caches
      .open(ASSETS)
      .then((cache) => Promise.all(urls.map((u) => cache.match(u).then((hit) => hit || cache.add(u).catch(() => undefined))))),
  );
});
