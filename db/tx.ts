import type { Database } from "./client";

/** A database or an open transaction: storage writes take either, so services compose them in one transaction. */
export type Tx = Database | Parameters<Parameters<Database["transaction"]>[0]>[0];
