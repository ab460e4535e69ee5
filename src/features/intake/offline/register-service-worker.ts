/**
 * Registers the service worker (public/sw.js) in built apps, and tells it which files this page
 * loaded before it took control, so the intake view keeps working when the hall's network drops.
 * Browsers allow service workers only on https and on localhost.
 */
export function registerServiceWorker() {
  if (!import.meta.env.PROD || !('serviceWorker' in navigator)) return;
  const assets = (names: string[]) => names.filter((n) => n.startsWith(`${location.origin}/assets/`));
  window.addEventListener('load', () => {
    navigator.serviceWorker
      .register('/sw.js')
      .then(() => navigator.serviceWorker.ready)
      .then((registration) => {
        const warm = (urls: string[]) => urls.length && registration.active?.postMessage({ type: 'warm', urls });
        warm(assets(performance.getEntriesByType('resource').map((e) => e.name)));
        // Route chunks loaded later pass through the worker once it controls the page; until then, list them.
        new PerformanceObserver((list) => warm(assets(list.getEntries().map((e) => e.name)))).observe({ type: 'resource' });
      })
      .catch(() => {
        // Without a worker the app still works online; only offline start-up is lost.
      });
  });
}
