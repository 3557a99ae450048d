// Caddis portal service worker. It keeps only what is the same for everyone: the offline page
// of each language and the app's static files (scripts, styles, fonts, icons) — which is what the
// check-in screens run on once a page is open. It never stores a page, an API answer or any
// other response that could hold patient data; check-ins waiting to be sent live in the page's
// own outbox (components/check-in/outbox.ts), not here.
const VERSION = "caddis-sw-v1";
// The locales come from the registration (lib/i18n/routing, the one list); English at least.
const LOCALES = (new URL(self.location.href).searchParams.get("locales") ?? "en").split(",").filter((l) => /^[a-z]{2}$/.test(l));
const STATIC = /^\/(_next\/static\/|icon[-.]|apple-icon|manifest\.webmanifest$)/;

async function precache() {
  const cache = await caches.open(VERSION);
  const assets = new Set();
  for (const locale of LOCALES) {
    const url = `/${locale}/offline`;
    try {
      const res = await fetch(url, { credentials: "omit", cache: "no-store" });
      if (!res.ok) continue;
      const html = await res.clone().text();
      await cache.put(url, res);
      for (const m of html.matchAll(/(?:href|src)="(\/_next\/static\/[^"]+)"/g)) assets.add(m[1]);
    } catch {
      /* offline while installing: try again next time */
    }
  }
  await Promise.all([...assets].map((a) => cache.add(a).catch(() => undefined)));
}

self.addEventListener("install", (event) => {
  event.waitUntil(precache().then(() => self.skipWaiting()));
});

self.addEventListener("activate", (event) => {
  event.waitUntil(
    caches
      .keys()
      .then((keys) => Promise.all(keys.filter((k) => k !== VERSION).map((k) => caches.delete(k))))
      .then(() => self.clients.claim()),
  );
});

self.addEventListener("fetch", (event) => {
  const request = event.request;
  if (request.method !== "GET") return;
  const url = new URL(request.url);
  if (url.origin !== self.location.origin || url.pathname.startsWith("/api/")) return;

  if (request.mode === "navigate") {
    // Pages always come from the network (they hold patient data); the offline page stands in.
    event.respondWith(
      fetch(request).catch(async () => {
        const locale = LOCALES.find((l) => url.pathname === `/${l}` || url.pathname.startsWith(`/${l}/`)) ?? "en";
        const cache = await caches.open(VERSION);
        return (await cache.match(`/${locale}/offline`)) ?? (await cache.match("/en/offline")) ?? Response.error();
      }),
    );
    return;
  }

  if (STATIC.test(url.pathname)) {
    // Hashed, immutable files: cache first, fill on the way.
    event.respondWith(
      caches.open(VERSION).then(async (cache) => {
        const hit = await cache.match(request);
        if (hit) return hit;
        const res = await fetch(request);
        if (res.ok && res.type === "basic") cache.put(request, res.clone());
        return res;
      }),
    );
  }
});

// A reminder or an alert sent by Web Push (lib/push): show it, and open its page on a tap. The
// payload holds only the words of the notification and a path in this app; nothing is cached.
self.addEventListener("push", (event) => {
  let data = {};
  try {
    data = event.data ? event.data.json() : {};
  } catch {
    data = { body: event.data ? event.data.text() : "" };
  }
  const url = typeof data.url === "string" && data.url.startsWith("/") && !data.url.startsWith("//") ? data.url : "/";
  event.waitUntil(
    self.registration.showNotification(data.title || "Caddis", {
      body: data.body || "",
      tag: data.tag || undefined,
      icon: "/icon-192.png",
      badge: "/icon-192.png",
      data: { url },
    }),
  );
});

self.addEventListener("notificationclick", (event) => {
  event.notification.close();
  const target = new URL(event.notification.data?.url ?? "/", self.location.origin).href;
  event.waitUntil(
    self.clients.matchAll({ type: "window", includeUncontrolled: true }).then((windows) => {
      const open = windows.find((w) => w.url === target);
      if (open) return open.focus();
      return self.clients.openWindow(target);
    }),
  );
});
