/**
 * Where a link may send a person (callbackUrl after sign-in and the like). The target is resolved
 * with `URL` against the site's origin, the way the browser will resolve it (a backslash reads as a
 * slash, tabs and newlines vanish), and only a path on that same origin passes; anything else gives
 * the fallback. Used on the server and in the browser alike.
 */
export function sameOriginPath(target: unknown, origin: string, fallback = '/'): string {
  if (typeof target !== 'string' || target === '') return fallback;
  let site: URL;
  let url: URL;
  try {
    site = new URL(origin);
    url = new URL(target, site);
  } catch {
    return fallback;
  }
  if (url.origin !== site.origin) return fallback;
  // `/.//host` stays on the origin, but its path begins with two slashes and names a host once resolved again.
  if (url.pathname.startsWith('//')) return fallback;
  return `${url.pathname}${url.search}${url.hash}`;
}
