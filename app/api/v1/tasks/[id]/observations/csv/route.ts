import { NextResponse } from "next/server";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { recordObservationCsv } from "@/lib/services/record-observations";
import { readTextUpload } from "@/lib/storage";
import { MAX_CSV_BYTES, observationCsvField } from "@/lib/validations/observations-csv";
import { idParams } from "@/lib/validations/params";

/** The observation log as a CSV file: the body as text/csv, or multipart with the file in field "file". */
export const POST = handler({ roles: can.recordObservations, params: idParams, maxBodyBytes: MAX_CSV_BYTES }, async ({ req, user, params, now }) => {
  const text = await readTextUpload(req, MAX_CSV_BYTES, observationCsvField);
  return NextResponse.json(await recordObservationCsv(user, params.id, text, { now }), { status: 201 });
});
