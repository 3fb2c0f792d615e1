import { NextResponse } from "next/server";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { listCandidateSkymaps, uploadSkymap } from "@/lib/data/skymaps";
import { parseMultipart, readBodyBytes, requireMultipart, singleFile } from "@/lib/storage";
import { maxSkymapBytes, skymapFileField } from "@/lib/validations/skymaps";
import { idParams } from "@/lib/validations/params";

export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => ({ skymaps: await listCandidateSkymaps(params.id) }));

/**
 * Upload from the candidate page: multipart with the FITS file (optionally gzip'd) in field "file". The body is read
 * with a limit (413 from Content-Length, else while reading), then parsed with the platform's FormData parser.
 */
export const POST = handler({ roles: can.uploadSkymap, params: idParams }, async ({ req, user, params }) => {
  requireMultipart(req.headers.get("content-type"));
  const raw = await readBodyBytes(req, maxSkymapBytes + 64 * 1024);
  const file = singleFile(await parseMultipart(raw, req.headers.get("content-type")), skymapFileField);
  const answer = await uploadSkymap({
    target: { candidateId: params.id },
    fileName: file.name,
    bytes: file.bytes,
    actorId: user.id,
    via: "ui",
  });
  return NextResponse.json(answer, { status: 201 });
});
