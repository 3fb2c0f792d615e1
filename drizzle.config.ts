import { mkdirSync } from "node:fs";
import { defineConfig } from "drizzle-kit";

// libSQL cannot create a file in a missing folder.
mkdirSync("data", { recursive: true });

export default defineConfig({
  dialect: "turso",
  schema: "./db/schema/index.ts",
  out: "./drizzle",
  dbCredentials: { url: process.env.DATABASE_URL ?? "file:./data/chirpdesk.db" },
  strict: true,
  verbose: false,
});
