/**
 * Signs out through next-auth's own endpoints (CSRF token, then the sign-out POST) without loading its browser
 * client on every page; the sign-in page still uses the full client.
 */
export async function signOutAndLeave(): Promise<void> {
  try {
    const { csrfToken } = (await (await fetch("/api/auth/csrf")).json()) as { csrfToken: string };
    await fetch("/api/auth/signout", {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded" },
      body: new URLSearchParams({ csrfToken, callbackUrl: "/sign-in", json: "true" }),
    });
  } finally {
    // A full page load on purpose: it drops every cached query of the person who just left.
    // eslint-disable-next-line @next/next/no-location-assign-relative-destination
    window.location.assign("/sign-in");
  }
}
