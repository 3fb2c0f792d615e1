import { Badge } from "@/components/ui/badge";
import { Panel } from "@/components/ui/panel";
import type { DeadLetterSummary } from "@/lib/data/dead-letters";

const statusLabels: Record<number, string> = { 400: "not JSON", 422: "refused by schema" };

function utc(instant: Date): string {
  return `${instant.toISOString().replace("T", " ").slice(0, 23)} UTC`;
}

/** One refused post: when, why, which fields, and the raw body as received. */
export function DeadLetterCard({ letter }: { letter: DeadLetterSummary }) {
  const truncated = letter.rawBodyBytes > letter.rawBodyPreview.length;
  return (
    <Panel aria-label={`Rejected post received ${utc(letter.receivedAt)}`}>
      <div className="flex flex-wrap items-center gap-2 text-sm">
        <Badge tone={letter.statusCode === 400 ? "alarm" : "warn"}>
          {letter.statusCode} {statusLabels[letter.statusCode] ?? ""}
        </Badge>
        <time className="font-mono text-muted" dateTime={letter.receivedAt.toISOString()}>
          {utc(letter.receivedAt)}
        </time>
        {letter.source || letter.externalId ? (
          <span className="font-mono">
            {letter.source ?? "?"} / {letter.externalId ?? "?"}
          </span>
        ) : null}
        <span className="text-muted">{letter.rawBodyBytes.toLocaleString("en")} bytes</span>
      </div>
      <p className="mt-2 text-sm">{letter.reason}</p>
      {letter.issues && letter.issues.length > 0 ? (
        <ul className="mt-2 space-y-0.5 text-sm">
          {letter.issues.slice(0, 20).map((issue, index) => (
            <li key={`${issue.path}-${index}`}>
              <code className="font-mono text-accent">{issue.path}</code> — {issue.message}
            </li>
          ))}
          {letter.issues.length > 20 ? <li className="text-muted">… and {letter.issues.length - 20} more</li> : null}
        </ul>
      ) : null}
      <details className="mt-2">
        <summary className="cursor-pointer text-sm text-muted">Raw body{truncated ? " (first 2 000 characters)" : ""}</summary>
        <pre className="mt-2 max-h-80 overflow-auto whitespace-pre-wrap break-all rounded bg-sunken p-2 font-mono text-xs">
          {letter.rawBodyPreview}
        </pre>
        {truncated ? (
          <a className="text-sm text-accent underline" href={`/api/v1/dead-letters?id=${encodeURIComponent(letter.id)}`}>
            Whole letter as JSON
          </a>
        ) : null}
      </details>
    </Panel>
  );
}
