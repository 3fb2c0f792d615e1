"use client";

import { RefreshCw } from "lucide-react";
import { useRouter } from "next/navigation";
import { useEffect, useState } from "react";
import { ZonedTime } from "@/components/paging/zoned-time";
import { Button } from "@/components/ui/button";
import { cn } from "@/components/ui/cn";

export interface MailboxMessage {
  id: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  receivedAt: string;
}

/** Text with its http(s) links clickable, so the acknowledge link can be followed from here. */
function Linkified({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/\S+)/g);
  return (
    <pre className="whitespace-pre-wrap break-words font-mono text-xs">
      {parts.map((part, i) =>
        /^https?:\/\//.test(part) ? (
          <a key={i} href={part} className="text-accent underline" target="_blank" rel="noreferrer">
            {part}
          </a>
        ) : (
          part
        ),
      )}
    </pre>
  );
}

export function MailboxList({ messages, timeZone }: { messages: MailboxMessage[]; timeZone: string }) {
  const router = useRouter();
  const [openId, setOpenId] = useState<string | null>(messages[0]?.id ?? null);
  const [view, setView] = useState<"text" | "html">("text");
  useEffect(() => {
    const timer = setInterval(() => router.refresh(), 5_000);
    return () => clearInterval(timer);
  }, [router]);
  const open = messages.find((m) => m.id === openId) ?? null;
  return (
    <div className="grid gap-3 lg:grid-cols-[22rem_1fr]">
      <div className="space-y-2">
        <Button size="sm" variant="ghost" onClick={() => router.refresh()}>
          <RefreshCw aria-hidden className="h-4 w-4" /> Refresh (also every 5 s)
        </Button>
        <ul className="divide-y divide-line overflow-hidden rounded-lg border border-line bg-surface" data-testid="mailbox">
          {messages.map((m) => (
            <li key={m.id}>
              <button type="button" onClick={() => setOpenId(m.id)} className={cn("block w-full px-3 py-2 text-left hover:bg-raised", m.id === openId && "bg-raised")}>
                <span className="block truncate text-sm font-medium">{m.subject}</span>
                <span className="block truncate text-xs text-muted">to {m.to.join(", ")}</span>
                <ZonedTime at={m.receivedAt} timeZone={timeZone} className="text-[11px] text-faint" />
              </button>
            </li>
          ))}
        </ul>
      </div>
      {open ? (
        <article className="rounded-lg border border-line bg-surface p-4">
          <h2 className="font-semibold">{open.subject}</h2>
          <p className="text-xs text-muted">
            From {open.from} to {open.to.join(", ")}
          </p>
          <div role="group" aria-label="Part" className="my-3 inline-flex rounded-md border border-line p-0.5">
            {(["text", "html"] as const).map((v) => (
              <button key={v} type="button" aria-pressed={view === v} disabled={v === "html" && !open.html} onClick={() => setView(v)} className={cn("rounded px-3 py-1 text-sm", view === v ? "bg-raised font-medium" : "text-muted")}>
                {v === "text" ? "Text" : "HTML"}
              </button>
            ))}
          </div>
          {view === "html" && open.html ? (
            <iframe title="HTML part" sandbox="" srcDoc={open.html} className="h-96 w-full rounded border border-line bg-white" />
          ) : (
            <Linkified text={open.text} />
          )}
        </article>
      ) : null}
    </div>
  );
}
