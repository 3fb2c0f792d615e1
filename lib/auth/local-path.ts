/**
 * `path` when it is a path on this site, else `fallback`. A leading "/" is not enough: "//host" and "/\host" are
 * read by browsers as another site (protocol-relative), which would make the sign-in page an open redirect.
 */
export function localPathOr(path: string | undefined, fallback: string): string {
  if (!path || !path.startsWith("/") || path.startsWith("//") || path.startsWith("/\\")) return fallback;
  return path;
}
