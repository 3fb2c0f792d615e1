import { createECDH } from "node:crypto";

function fromBase64Url(text: string): Buffer | null {
  return /^[A-Za-z0-9_-]+={0,2}$/.test(text) ? Buffer.from(text, "base64url") : null;
}

/**
 * Whether a browser's p256dh key is an uncompressed point on P-256 (RFC 8291 Section 3.1 uses it for ECDH):
 * 65 bytes, 0x04 first, and accepted by an ECDH computation (which refuses a point off the curve).
 */
export function isP256PublicKey(text: string): boolean {
  const bytes = fromBase64Url(text);
  if (!bytes || bytes.length !== 65 || bytes[0] !== 0x04) return false;
  try {
    const ecdh = createECDH("prime256v1");
    ecdh.generateKeys();
    ecdh.computeSecret(bytes);
    return true;
  } catch {
    return false;
  }
}

/** Whether a push auth secret is the 16 bytes RFC 8291 Section 3.2 requires. */
export function isPushAuthSecret(text: string): boolean {
  return fromBase64Url(text)?.length === 16;
}
