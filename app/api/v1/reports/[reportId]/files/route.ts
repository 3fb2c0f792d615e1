import { NextResponse } from "next/server";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { attachReportFiles, listReportFiles } from "@/lib/data/uploads";
import { parseMultipart, readBodyBytes, requireMultipart } from "@/lib/storage";
import { maxReportRequestBytes, reportFilesField } from "@/lib/validations/uploads";
import { reportIdParams } from "@/lib/validations/params";

export const GET = handler({ roles: can.read, params: reportIdParams }, async ({ params }) => ({ files: await listReportFiles(params.reportId) }));

/**
 * Attaches files to a report: multipart, one or more files in field "files". Each file is size- and type-checked
 * (by its first bytes) before any is stored; all or none are attached.
 */
export const POST = handler({ roles: can.claimTask, params: reportIdParams }, async ({ req, user, params }) => {
  requireMultipart(req.headers.get("content-type"));
  const raw = await readBodyBytes(req, maxReportRequestBytes);
  const body = await parseMultipart(raw, req.headers.get("content-type"));
  const files = body.files.filter((f) => f.field === reportFilesField);
  return NextResponse.json({ files: await attachReportFiles(user, params.reportId, files) }, { status: 201 });
});
