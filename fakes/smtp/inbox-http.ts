// JSON inbox API of the fake SMTP server, on its own port, so the dev mailbox page and tests in other
// processes can read what arrived and flip the outage switch.
import { createServer } from "node:http";
import type { ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";
import { parseSinceAfter } from "../message-filter";
import type { FakeSmtp, MailFilter, OutageMode } from "./server";
import type { StoredMail, StoredMailJson } from "./stored-mail";

type InboxControl = Pick<FakeSmtp, "messages" | "clear" | "setDown" | "isDown">;

function reply(res: ServerResponse, status: number, json?: unknown): void {
  if (json === undefined) {
    res.writeHead(status).end();
    return;
  }
  res.writeHead(status, { "content-type": "application/json; charset=utf-8" }).end(JSON.stringify(json));
}

/** The shared `since`/`after` filter plus `to`. */
function parseFilter(query: URLSearchParams): MailFilter | string {
  const filter = parseSinceAfter(query);
  if (typeof filter === "string") return filter;
  const to = query.get("to");
  return to === null ? filter : { ...filter, to };
}

async function readJson(req: AsyncIterable<Buffer>): Promise<unknown> {
  const chunks: Buffer[] = [];
  let total = 0;
  for await (const chunk of req) {
    total += chunk.length;
    if (total > 16 * 1024) return undefined;
    chunks.push(chunk);
  }
  try {
    return JSON.parse(Buffer.concat(chunks).toString("utf8"));
  } catch {
    return undefined;
  }
}

const OUTAGE_MODES: readonly OutageMode[] = ["reply-421", "refuse-connections"];
const isOutageMode = (value: unknown): value is OutageMode => OUTAGE_MODES.some((m) => m === value);

export async function startInboxHttp(
  inbox: InboxControl,
  options: { port: number; host: string; toJson: (mail: StoredMail) => StoredMailJson },
): Promise<{ url: string; close(): Promise<void> }> {
  const server = createServer((req, res) => {
    void (async () => {
      const url = new URL(req.url ?? "/", "http://fake.invalid");
      const method = req.method ?? "GET";
      const one = /^\/messages\/([^/]+)$/.exec(url.pathname);
      if (url.pathname === "/messages" && method === "GET") {
        const filter = parseFilter(url.searchParams);
        if (typeof filter === "string") return reply(res, 400, { error: filter });
        return reply(res, 200, inbox.messages(filter).map(options.toJson));
      }
      if (url.pathname === "/messages" && method === "DELETE") {
        inbox.clear();
        return reply(res, 204);
      }
      if (one?.[1] && method === "GET") {
        const mail = inbox.messages().find((m) => m.id === decodeURIComponent(one[1] ?? ""));
        return mail ? reply(res, 200, options.toJson(mail)) : reply(res, 404, { error: "no such message" });
      }
      if (url.pathname === "/outage" && method === "GET") return reply(res, 200, { down: inbox.isDown() });
      if (url.pathname === "/outage" && method === "PUT") {
        const body = await readJson(req);
        const down = typeof body === "object" && body !== null && "down" in body ? body.down : undefined;
        const mode = typeof body === "object" && body !== null && "mode" in body ? body.mode : undefined;
        if (typeof down !== "boolean" || (mode !== undefined && !isOutageMode(mode))) {
          return reply(res, 400, { error: `body must be { down: boolean, mode?: ${OUTAGE_MODES.join(" | ")} }` });
        }
        await inbox.setDown(down, { mode: isOutageMode(mode) ? mode : undefined });
        return reply(res, 200, { down: inbox.isDown() });
      }
      req.resume();
      reply(res, 404, { error: `no route ${method} ${url.pathname}` });
    })().catch((error: unknown) => {
      if (!res.headersSent) reply(res, 500, { error: String(error) });
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port, options.host, () => {
      server.off("error", reject);
      resolve();
    });
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://${options.host.includes(":") ? `[${options.host}]` : options.host}:${port}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}
