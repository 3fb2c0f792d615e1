import { BlockList, isIP } from "node:net";

/** The header server/peer-address.mjs stamps with the socket's address; trusted only when that preload says so. */
const PEER_HEADER = "x-chirpdesk-peer";

/** Strips the IPv4-mapped IPv6 prefix so "::ffff:10.0.0.1" and "10.0.0.1" are one client. */
function normalise(address: string): string {
  const trimmed = address.trim().replace(/^\[|\]$/g, "");
  return /^::ffff:\d+\.\d+\.\d+\.\d+$/i.test(trimmed) ? trimmed.slice(7) : trimmed;
}

/** Parses TRUSTED_PROXIES: comma-separated addresses or CIDR ranges (IPv4 or IPv6). Throws naming a bad entry. */
export function parseTrustedProxies(text: string | undefined): BlockList {
  const list = new BlockList();
  for (const entry of (text ?? "").split(",").map((e) => e.trim()).filter(Boolean)) {
    const [address = "", bits] = entry.split("/");
    const family = isIP(address);
    if (!family) throw new Error(`TRUSTED_PROXIES: "${entry}" is not an IP address or CIDR range`);
    const type = family === 4 ? "ipv4" : "ipv6";
    if (bits === undefined) list.addAddress(address, type);
    else list.addSubnet(address, Number(bits), type);
  }
  return list;
}

function isTrusted(list: BlockList, address: string): boolean {
  const family = isIP(address);
  return family !== 0 && list.check(address, family === 4 ? "ipv4" : "ipv6");
}

/**
 * The client's address for rate limits: the socket peer, unless the peer is a trusted proxy, in which case the
 * nearest X-Forwarded-For entry that is not itself a trusted proxy (entries further left are the client's own
 * claims and are never read past an untrusted hop). Without the peer stamp (a server started without the preload,
 * or a handler called in a test) the only address is Next's X-Forwarded-For, which a client can set: "unknown:" +
 * that value keeps such clients apart from stamped ones and is logged once by the caller.
 */
export function clientAddress(headers: Headers, trusted: BlockList, peerStamped: boolean): string {
  const peer = peerStamped ? normalise(headers.get(PEER_HEADER) ?? "") : "";
  const hops = (headers.get("x-forwarded-for") ?? "").split(",").map(normalise).filter(Boolean);
  if (!peer) return `unknown:${hops.at(-1) ?? "none"}`;
  if (!isTrusted(trusted, peer)) return peer;
  for (let i = hops.length - 1; i >= 0; i--) {
    const hop = hops[i]!;
    if (!isTrusted(trusted, hop)) return hop;
  }
  return hops[0] ?? peer;
}
