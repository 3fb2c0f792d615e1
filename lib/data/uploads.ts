import { and, asc, desc, eq, inArray } from "drizzle-orm";
import { getDb, type Tx } from "@/db";
import { followUpTasks, sites, taskReportFiles, taskReports, uploads, users, type Upload } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import { eventKinds } from "@/lib/events/kinds";
import { checkReportFileType, removeStored, storeBytes, type StoredFile, type UploadedPart } from "@/lib/storage";
import { maxReportFileBytes, maxReportFilesPerRequest } from "@/lib/validations/uploads";
import { appendEvent } from "./events";

export interface UploadSummary {
  id: string;
  originalName: string;
  mimeType: string;
  sizeBytes: number;
  sha256: string;
  createdAt: string;
  uploadedBy: { id: string; name: string } | null;
  /** Where the browser fetches it (role-checked). */
  url: string;
}

export function uploadUrl(id: string): string {
  return `/api/v1/uploads/${id}`;
}

/** A file name safe to keep and to send back in Content-Disposition: no paths, no control characters. */
export function cleanFileName(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? "";
  const cleaned = base.replace(/[\u0000-\u001f\u007f"]/g, "").trim().slice(0, 200);
  return cleaned || "upload";
}

/** Removes files this request stored when the rows that would have pointed at them were not written. */
export async function discardStored(stored: ReadonlyArray<StoredFile>, suffixes: readonly string[] = []): Promise<void> {
  const db = await getDb();
  for (const file of stored) {
    if (!file.created) continue;
    // another upload of the same bytes may have committed meanwhile: keep the file then
    const [kept] = await db.select({ id: uploads.id }).from(uploads).where(eq(uploads.sha256, file.sha256)).limit(1);
    if (kept) continue;
    await removeStored(file.sha256);
    for (const suffix of suffixes) await removeStored(file.sha256, suffix);
  }
}

export async function getUpload(id: string): Promise<Upload | null> {
  const db = await getDb();
  const [row] = await db.select().from(uploads).where(eq(uploads.id, id)).limit(1);
  return row ?? null;
}

/**
 * Attaches observation files to a task report. Every file is checked (size, then type by its first bytes)
 * before anything is stored; then the files are stored and all rows written in one transaction.
 */
export async function attachReportFiles(
  actor: SessionUser,
  reportId: string,
  parts: ReadonlyArray<UploadedPart>,
  now: Date = new Date(),
): Promise<UploadSummary[]> {
  if (parts.length === 0) throw new ApiError(422, 'send at least one file in the multipart field "files"');
  if (parts.length > maxReportFilesPerRequest) throw new ApiError(422, `at most ${maxReportFilesPerRequest} files at a time`);
  const report = await reportWithTask(reportId);
  if (actor.role !== "coordinator" && report.authorId !== actor.id) {
    throw new ApiError(403, "only the observer who wrote this report (or a coordinator) may attach files to it");
  }
  const checked = parts.map((part) => {
    const name = cleanFileName(part.name);
    if (part.bytes.byteLength > maxReportFileBytes) {
      throw new ApiError(413, `${name} is ${part.bytes.byteLength} bytes; each file may be at most ${maxReportFileBytes} bytes`);
    }
    if (part.bytes.byteLength === 0) throw new ApiError(422, `${name} is empty`);
    const type = checkReportFileType(name, part.bytes);
    if (!type.ok) throw new ApiError(415, type.reason, { file: name });
    return { part, name, mimeType: type.type.mimeType };
  });

  const stored: StoredFile[] = [];
  try {
    for (const { part } of checked) stored.push(await storeBytes(part.bytes));
    const db = await getDb();
    const rows = await db.transaction(async (tx) => {
      const inserted = await tx
        .insert(uploads)
        .values(
          checked.map((c, i) => ({
            sha256: stored[i]?.sha256 ?? "",
            kind: "report" as const,
            originalName: c.name,
            mimeType: c.mimeType,
            sizeBytes: c.part.bytes.byteLength,
            uploadedById: actor.id,
            createdAt: now,
          })),
        )
        .returning();
      await tx.insert(taskReportFiles).values(inserted.map((u) => ({ reportId, uploadId: u.id })));
      await appendEvent(tx, {
        at: now,
        kind: eventKinds.reportFilesAttached,
        actorId: actor.id,
        candidateId: report.candidateId,
        taskId: report.taskId,
        data: { reportId, uploadIds: inserted.map((u) => u.id) },
      });
      return inserted;
    });
    return rows.map((row) => toSummary(row, { id: actor.id, name: actor.name }));
  } catch (error) {
    await discardStored(stored);
    throw error;
  }
}

async function reportWithTask(reportId: string) {
  const db = await getDb();
  const [report] = await db
    .select({ id: taskReports.id, authorId: taskReports.authorId, taskId: taskReports.taskId, candidateId: followUpTasks.candidateId })
    .from(taskReports)
    .innerJoin(followUpTasks, eq(followUpTasks.id, taskReports.taskId))
    .where(eq(taskReports.id, reportId))
    .limit(1);
  if (!report) throw new ApiError(404, "report not found");
  return report;
}

function toSummary(row: Upload, uploader: { id: string; name: string } | null): UploadSummary {
  return {
    id: row.id,
    originalName: row.originalName,
    mimeType: row.mimeType,
    sizeBytes: row.sizeBytes,
    sha256: row.sha256,
    createdAt: row.createdAt.toISOString(),
    uploadedBy: uploader,
    url: uploadUrl(row.id),
  };
}

async function filesOfReports(q: Tx, reportIds: string[]): Promise<Map<string, UploadSummary[]>> {
  const byReport = new Map<string, UploadSummary[]>();
  if (reportIds.length === 0) return byReport;
  const rows = await q
    .select({ reportId: taskReportFiles.reportId, upload: uploads, uploaderId: users.id, uploaderName: users.name })
    .from(taskReportFiles)
    .innerJoin(uploads, eq(uploads.id, taskReportFiles.uploadId))
    .leftJoin(users, eq(users.id, uploads.uploadedById))
    .where(inArray(taskReportFiles.reportId, reportIds))
    .orderBy(asc(uploads.createdAt), asc(uploads.originalName));
  for (const row of rows) {
    const list = byReport.get(row.reportId) ?? [];
    list.push(toSummary(row.upload, row.uploaderId ? { id: row.uploaderId, name: row.uploaderName ?? "" } : null));
    byReport.set(row.reportId, list);
  }
  return byReport;
}

export async function listReportFiles(reportId: string): Promise<UploadSummary[]> {
  await reportWithTask(reportId);
  const db = await getDb();
  return (await filesOfReports(db, [reportId])).get(reportId) ?? [];
}

export interface CandidateReport {
  id: string;
  result: string;
  createdAt: string;
  author: { id: string; name: string; initials: string } | null;
  task: { id: string; kind: string; state: string; site: { id: string; code: string; name: string } | null };
  files: UploadSummary[];
}

/** A candidate's observation reports, newest first, each with its task, site, author and files. */
export async function listCandidateReports(candidateId: string): Promise<CandidateReport[]> {
  const db = await getDb();
  const rows = await db
    .select({
      report: taskReports,
      task: { id: followUpTasks.id, kind: followUpTasks.kind, state: followUpTasks.state },
      site: { id: sites.id, code: sites.code, name: sites.name },
      author: { id: users.id, name: users.name, initials: users.initials },
    })
    .from(taskReports)
    .innerJoin(followUpTasks, eq(followUpTasks.id, taskReports.taskId))
    .leftJoin(sites, eq(sites.id, followUpTasks.siteId))
    .leftJoin(users, eq(users.id, taskReports.authorId))
    .where(and(eq(followUpTasks.candidateId, candidateId)))
    .orderBy(desc(taskReports.createdAt))
    .limit(200);
  const files = await filesOfReports(
    db,
    rows.map((r) => r.report.id),
  );
  return rows.map(({ report, task, site, author }) => ({
    id: report.id,
    result: report.result,
    createdAt: report.createdAt.toISOString(),
    author: author?.id ? author : null,
    task: { ...task, site: site?.id ? site : null },
    files: files.get(report.id) ?? [],
  }));
}
