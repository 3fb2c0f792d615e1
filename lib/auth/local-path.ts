const PROBE_ORIGIN = "http://chirpdesk.invalid";

/**
 * `path` when it is a path on this site, else `fallback`; the answer is the normalised form a browser would request.
 * Browsers drop tabs and newlines from URLs and read "//host" and "/\host" as another site, so "/\t/evil" becomes
 * "//evil": the path is parsed the way a browser parses it, and kept only if it stays on our origin. Control
 * characters are refused outright (a newline in a Location header is a server error, not a redirect).
 */
export function localPathOr(path: string | undefined, fallback: string): string {
  if (!path || !path.startsWith("/") || /[\u0000-\u001f\u007f\\]/.test(path)) return fallback;
  let url: URL;
  try {
    url = new URL(path, PROBE_ORIGIN);
  } catch {
    return fallback;
  }
  if (url.origin !== PROBE_ORIGIN) return fallback;
  const normalised = url.pathname + url.search + url.hash;
  return normalised.startsWith("//") ? fallback : normalised;
}
