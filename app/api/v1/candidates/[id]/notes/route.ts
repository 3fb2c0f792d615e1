import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { addNote, listNotes } from "@/lib/data/candidates";
import { noteBodySchema } from "@/lib/validations/candidates";
import { idParams } from "@/lib/validations/params";

/** The candidate's notes thread, oldest first. */
export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => listNotes(params.id));

/** Anyone who can read a candidate may add to its thread. */
export const POST = handler({ roles: can.read, params: idParams, body: noteBodySchema }, async ({ user, body, params }) =>
  addNote(user, params.id, body.body),
);
