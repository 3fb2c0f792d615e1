import { mkdirSync } from "node:fs";
import { defineConfig } from "drizzle-kit";
import { defaultDatabaseUrl } from "./lib/env";

// libSQL cannot create a file in a missing folder.
mkdirSync("data", { recursive: true });

export default defineConfig({
  dialect: "turso",
  schema: "./db/schema/index.ts",
  out: "./drizzle",
  dbCredentials: { url: process.env.DATABASE_URL || defaultDatabaseUrl },
  strict: true,
  verbose: false,
});
