/**
 * Floor check is a shell that renders on the tablet from IndexedDB: the same page for everyone,
 * which the service worker keeps from its first install, so it opens offline on the first visit.
 * Who is signed in is decided on the client (see $lib/offline/session).
 */
export const ssr = false;
