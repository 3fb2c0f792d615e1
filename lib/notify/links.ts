/** The app's public origin for links in e-mails and push messages (APP_URL, else NEXTAUTH_URL). */
export function appBaseUrl(env: Record<string, string | undefined> = process.env): string {
  return (env.APP_URL || env.NEXTAUTH_URL || "http://localhost:3000").replace(/\/+$/, "");
}

export const candidatePath = (candidateId: string) => `/candidates/${encodeURIComponent(candidateId)}`;
export const ackPagePath = (token: string) => `/ack/${encodeURIComponent(token)}`;
export const ackConfirmPath = (token: string) => `/ack/${encodeURIComponent(token)}/confirm`;
