/**
 * The e-mail of a credentials post, read as next-auth 4 reads bodies (next-auth/next/utils getBody): JSON when the
 * content type mentions application/json, a form when it mentions application/x-www-form-urlencoded, else nothing
 * (next-auth then sees no credentials either).
 */
export async function readSignInEmail(req: Request): Promise<string> {
  const type = req.headers.get("content-type") ?? "";
  try {
    if (type.includes("application/json")) {
      const body: unknown = await req.json();
      const email = body && typeof body === "object" ? (body as Record<string, unknown>).email : undefined;
      return typeof email === "string" ? email : "";
    }
    if (type.includes("application/x-www-form-urlencoded")) return new URLSearchParams(await req.text()).get("email") ?? "";
  } catch {
    // an unreadable body carries no account; the address limit still applies
  }
  return "";
}
