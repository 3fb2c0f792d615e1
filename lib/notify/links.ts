import { config, type Config } from "@/lib/env";

/** The app's public origin for links in e-mails and push messages (APP_URL, else NEXTAUTH_URL). */
export function appBaseUrl(settings: Pick<Config, "APP_URL" | "NEXTAUTH_URL"> = config()): string {
  return (settings.APP_URL ?? settings.NEXTAUTH_URL ?? "http://localhost:3000").replace(/\/+$/, "");
}

export const candidatePath = (candidateId: string) => `/candidates/${encodeURIComponent(candidateId)}`;
export const ackPagePath = (token: string) => `/ack/${encodeURIComponent(token)}`;
export const ackConfirmPath = (token: string) => `/ack/${encodeURIComponent(token)}/confirm`;
