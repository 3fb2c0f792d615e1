import { readBodyBytes as readLimited } from "@/lib/api/body";

/** An upload's bytes, refused with 413 past `limitBytes` (declared or while streaming). */
export function readBodyBytes(req: Request, limitBytes: number): Promise<Uint8Array<ArrayBuffer>> {
  return readLimited(req, limitBytes, "upload");
}
