import { index, integer, real, sqliteTable, text } from "drizzle-orm/sqlite-core";
import { candidateRevisions, candidates } from "./candidates";
import { createdAt, idColumn } from "./columns";
import { followUpTasks } from "./tasks";
import { users } from "./users";

/** Files stored content-addressed (sha256) under data/uploads; this row is the metadata. */
export const uploads = sqliteTable(
  "uploads",
  {
    id: idColumn(),
    sha256: text("sha256").notNull(),
    kind: text("kind", { enum: ["skymap", "report"] }).notNull(),
    originalName: text("original_name").notNull(),
    mimeType: text("mime_type").notNull(),
    sizeBytes: integer("size_bytes").notNull(),
    uploadedById: text("uploaded_by_id").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [index("uploads_sha_idx").on(t.sha256)],
);
export type Upload = typeof uploads.$inferSelect;

/** Distances in Mpc: whole map (marginal), most probable pixel, and the probability carrying a distance. */
export interface SkymapDistance {
  meanMpc: number;
  stdMpc: number;
  atPeak: { meanMpc: number; stdMpc: number } | null;
  coveredProbability: number;
}

export const skymaps = sqliteTable(
  "skymaps",
  {
    id: idColumn(),
    uploadId: text("upload_id")
      .notNull()
      .references(() => uploads.id),
    candidateId: text("candidate_id")
      .notNull()
      .references(() => candidates.id, { onDelete: "cascade" }),
    revisionId: text("revision_id").references(() => candidateRevisions.id, { onDelete: "set null" }),
    layout: text("layout").notNull(),
    nside: integer("nside"),
    pixelCount: integer("pixel_count").notNull(),
    totalProbability: real("total_probability").notNull(),
    area50Deg2: real("area50_deg2").notNull(),
    area90Deg2: real("area90_deg2").notNull(),
    peakRaDeg: real("peak_ra_deg").notNull(),
    peakDecDeg: real("peak_dec_deg").notNull(),
    warnings: text("warnings", { mode: "json" }).$type<string[]>().notNull(),
    /** Distance summary of a 3D map (DISTMU/DISTSIGMA/DISTNORM); null for maps without distance columns. */
    distance: text("distance", { mode: "json" }).$type<SkymapDistance>(),
    createdAt: createdAt(),
  },
  (t) => [index("skymaps_candidate_idx").on(t.candidateId, t.createdAt)],
);
export type Skymap = typeof skymaps.$inferSelect;

export const taskReports = sqliteTable(
  "task_reports",
  {
    id: idColumn(),
    taskId: text("task_id")
      .notNull()
      .references(() => followUpTasks.id, { onDelete: "cascade" }),
    authorId: text("author_id").references(() => users.id, { onDelete: "set null" }),
    result: text("result").notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("task_reports_task_idx").on(t.taskId)],
);

export const taskReportFiles = sqliteTable("task_report_files", {
  id: idColumn(),
  reportId: text("report_id")
    .notNull()
    .references(() => taskReports.id, { onDelete: "cascade" }),
  uploadId: text("upload_id")
    .notNull()
    .references(() => uploads.id),
});
