// Phasewise's service worker: keeps every file of one release build on the device, so the
// app starts with no network after the first visit.
//
// `cargo xtask seal` (run by Trunk's post-build hook, see Trunk.toml) writes this file into the
// build with the two placeholders below filled in: the build's file list, and a version made
// from the files' contents. A new build therefore has a new worker, which fills a new cache
// beside the old one and waits; the page offers the user a restart, and only then is the old
// cache dropped. Files are content-hashed, so serving from the cache first is always correct.
const VERSION = "__PHASEWISE_VERSION__";
const FILES = __PHASEWISE_FILES__;
const CACHE = "phasewise-" + VERSION;
const PREFIX = "phasewise-";

self.addEventListener("install", (event) => {
  event.waitUntil(
    caches.open(CACHE).then((cache) => cache.addAll(FILES.map((f) => new Request(f, { cache: "reload" }))))
  );
});

self.addEventListener("activate", (event) => {
  event.waitUntil(
    caches
      .keys()
      .then((names) => Promise.all(names.filter((n) => n.startsWith(PREFIX) && n !== CACHE).map((n) => caches.delete(n))))
      .then(() => self.clients.claim())
  );
});

// The page asks for this when the user chooses to restart with a waiting new version.
self.addEventListener("message", (event) => {
  if (event.data && event.data.kind === "use-new-version") {
    self.skipWaiting();
  }
});

self.addEventListener("fetch", (event) => {
  const request = event.request;
  if (request.method !== "GET" || new URL(request.url).origin !== self.location.origin) {
    return;
  }
  // Every page address is the one app page: the area lives in the fragment.
  const key = request.mode === "navigate" ? "./" : request;
  event.respondWith(
    caches.open(CACHE).then((cache) =>
      cache.match(key, { ignoreSearch: request.mode === "navigate" }).then((hit) => hit || fetch(request))
    )
  );
});
