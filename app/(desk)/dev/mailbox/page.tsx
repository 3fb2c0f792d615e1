import { Mail } from "lucide-react";
import { notFound } from "next/navigation";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/auth/session";
import { config } from "@/lib/env";
import { MailboxList, type MailboxMessage } from "./mailbox-list";

export const metadata = { title: "Dev mailbox" };
export const dynamic = "force-dynamic";

async function readMailbox(base: string): Promise<MailboxMessage[] | string> {
  try {
    const res = await fetch(`${base.replace(/\/+$/, "")}/messages`, { cache: "no-store", signal: AbortSignal.timeout(3_000) });
    if (!res.ok) return `the fake SMTP server's inbox answered ${res.status}`;
    return ((await res.json()) as MailboxMessage[]).reverse();
  } catch (error) {
    return `cannot reach ${base}: ${error instanceof Error ? error.message : String(error)}`;
  }
}

/** Development only: what the local fake SMTP server received (DEV_MAILBOX_URL). Not found in production. */
export default async function DevMailboxPage() {
  const { NODE_ENV, DEV_MAILBOX_URL: base } = config();
  if (NODE_ENV === "production") notFound();
  const user = await requirePageUser();
  const messages = base ? await readMailbox(base) : "DEV_MAILBOX_URL is not set";
  return (
    <div className="max-w-5xl space-y-4">
      <PageHeader title="Dev mailbox" description="Every e-mail the app sent to the local fake SMTP server, newest first. Development only." />
      {typeof messages === "string" ? (
        <EmptyState icon={Mail} title="Mailbox unavailable">
          {messages}. Start the fakes with <code className="font-mono">npm run fakes</code> (the dev command does).
        </EmptyState>
      ) : messages.length === 0 ? (
        <EmptyState icon={Mail} title="No mail yet">
          Pages by e-mail land here. Post a candidate (the dev feed does every minute) or send yourself a test page from Settings.
        </EmptyState>
      ) : (
        <MailboxList messages={messages} timeZone={user.timeZone} />
      )}
    </div>
  );
}
