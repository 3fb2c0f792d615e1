import { NextResponse, type NextRequest } from "next/server";

/** Passes the requested path to server components, so a sign-in redirect can come back to it. */
export function proxy(request: NextRequest) {
  const requestHeaders = new Headers(request.headers);
  requestHeaders.set("x-chirpdesk-path", request.nextUrl.pathname + request.nextUrl.search);
  return NextResponse.next({ request: { headers: requestHeaders } });
}

export const config = {
  matcher: ["/((?!api|_next/static|_next/image|fonts|sw.js|favicon.ico|icon.svg|manifest.webmanifest).*)"],
};
