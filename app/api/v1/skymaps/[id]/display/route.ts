import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { getSkymap, readDisplayGridBytes } from "@/lib/data/skymaps";
import { idParams } from "@/lib/validations/params";

/** The stored nside-64 display grid (HPXG bytes, lib/skymap/display-grid.ts), for drawing in the browser. */
export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => {
  const skymap = await getSkymap(params.id);
  const bytes = await readDisplayGridBytes(skymap.file.sha256);
  return new Response(Buffer.from(bytes), {
    headers: {
      "content-type": "application/octet-stream",
      // content-addressed: the grid of this map never changes
      "cache-control": "private, max-age=31536000, immutable",
      etag: `"${skymap.file.sha256}-grid64"`,
    },
  });
});
