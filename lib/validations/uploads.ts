import { z } from "zod";

/** Observation-report attachments: each file at most this size, and at most this many per request. */
export const maxReportFileBytes = 50 * 1024 * 1024;
export const maxReportFilesPerRequest = 10;
/** The whole multipart body of one attach request. */
export const maxReportRequestBytes = maxReportFilesPerRequest * maxReportFileBytes + 1024 * 1024;
/** The multipart field the files travel in (repeat it for several). */
export const reportFilesField = "files";

/** Shown beside the file input. */
export const reportFileHint = "PNG, JPEG, FITS (.fits, .fits.gz), PDF, CSV or text; up to 50 MB each, 10 at a time";
export const reportFileAccept = ".png,.jpg,.jpeg,.fits,.fit,.fts,.gz,.pdf,.csv,.txt,.dat,.log";

/** GET /api/v1/reports?candidateId=… */
export const reportListQuerySchema = z.object({
  candidateId: z.string().trim().min(1, "give a candidateId"),
});
export type ReportListQuery = z.infer<typeof reportListQuerySchema>;
