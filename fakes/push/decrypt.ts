// The browser's side of Web Push message encryption: what a user agent does with a push message
// body before handing the plaintext to its service worker. Used by the fake's tests and by anyone
// who needs to read what the app sent through the fake push service.
import { createDecipheriv, createECDH, createHmac, randomBytes } from "node:crypto";

const P256_PUBLIC_KEY_BYTES = 65;
const AUTH_SECRET_BYTES = 16;
const SALT_BYTES = 16;
const GCM_TAG_BYTES = 16;
const NONCE_BYTES = 12;
const CEK_BYTES = 16;

/** What `PushSubscription.toJSON().keys` carries in a browser, plus the private half it never shows. */
export interface BrowserSubscriptionKeys {
  keys: { p256dh: string; auth: string };
  /** Raw 32-byte P-256 private scalar, base64url. */
  privateKey: string;
}

/** A fresh P-256 key pair and 16-byte auth secret, as a user agent makes for a new subscription (RFC 8291 Section 2). */
export function makeSubscriptionKeys(): BrowserSubscriptionKeys {
  const ecdh = createECDH("prime256v1");
  ecdh.generateKeys();
  return {
    keys: {
      p256dh: ecdh.getPublicKey().toString("base64url"),
      auth: randomBytes(AUTH_SECRET_BYTES).toString("base64url"),
    },
    // getPrivateKey drops leading zero octets; keep the fixed 32-byte form browsers and web-push use.
    privateKey: leftPad(ecdh.getPrivateKey(), 32).toString("base64url"),
  };
}

function leftPad(bytes: Buffer, lengthBytes: number): Buffer {
  return bytes.length >= lengthBytes ? bytes : Buffer.concat([Buffer.alloc(lengthBytes - bytes.length), bytes]);
}

/** The aes128gcm content-coding header (RFC 8188 Section 2.1). */
export interface Aes128gcmHeader {
  salt: Buffer;
  recordSizeBytes: number;
  /** For Web Push the key id is the sender's (application server's) ECDH public key (RFC 8291 Section 4). */
  keyId: Buffer;
  headerLengthBytes: number;
}

/** Parses salt (16) || rs (uint32) || idlen (1) || keyid (idlen) — RFC 8188 Section 2.1. */
export function parseAes128gcmHeader(body: Uint8Array): Aes128gcmHeader {
  const bytes = Buffer.from(body.buffer, body.byteOffset, body.byteLength);
  if (bytes.length < SALT_BYTES + 5) throw new Error("aes128gcm body shorter than its header");
  const salt = bytes.subarray(0, SALT_BYTES);
  const recordSizeBytes = bytes.readUInt32BE(SALT_BYTES);
  const idLength = bytes.readUInt8(SALT_BYTES + 4);
  const headerLengthBytes = SALT_BYTES + 5 + idLength;
  if (bytes.length < headerLengthBytes) throw new Error("aes128gcm key id runs past the body");
  // RFC 8188 Section 2: rs must leave room for the 16-byte tag and one delimiter octet.
  if (recordSizeBytes < GCM_TAG_BYTES + 2) throw new Error(`aes128gcm record size ${recordSizeBytes} too small`);
  return { salt, recordSizeBytes, keyId: bytes.subarray(SALT_BYTES + 5, headerLengthBytes), headerLengthBytes };
}

/** Every intermediate of the Web Push key schedule, so tests can compare each step with RFC 8291 Appendix A. */
export interface WebPushKeySchedule {
  prkKey: Buffer;
  keyInfo: Buffer;
  ikm: Buffer;
  prk: Buffer;
  cek: Buffer;
  nonce: Buffer;
}

function hmacSha256(key: Uint8Array, data: Uint8Array): Buffer {
  return createHmac("sha256", key).update(data).digest();
}

/** HKDF-Expand for output no longer than one hash block: T(1) = HMAC(PRK, info || 0x01) (RFC 5869 Section 2.3). */
function hkdfExpandOneBlock(prk: Uint8Array, info: Uint8Array, lengthBytes: number): Buffer {
  return hmacSha256(prk, Buffer.concat([info, Buffer.from([1])])).subarray(0, lengthBytes);
}

/**
 * Key derivation of RFC 8291 Section 3.4 (IKM from the ECDH secret and auth secret) followed by
 * RFC 8188 Section 2.2 / 2.3 (CEK and NONCE from IKM and salt), both HKDF-SHA-256 (RFC 5869).
 */
export function deriveWebPushKeys(input: {
  ecdhSecret: Uint8Array;
  authSecret: Uint8Array;
  uaPublic: Uint8Array;
  asPublic: Uint8Array;
  salt: Uint8Array;
}): WebPushKeySchedule {
  const prkKey = hmacSha256(input.authSecret, input.ecdhSecret);
  const keyInfo = Buffer.concat([Buffer.from("WebPush: info\0", "latin1"), input.uaPublic, input.asPublic]);
  const ikm = hkdfExpandOneBlock(prkKey, keyInfo, 32);
  const prk = hmacSha256(input.salt, ikm);
  const cek = hkdfExpandOneBlock(prk, Buffer.from("Content-Encoding: aes128gcm\0", "latin1"), CEK_BYTES);
  const nonce = hkdfExpandOneBlock(prk, Buffer.from("Content-Encoding: nonce\0", "latin1"), NONCE_BYTES);
  return { prkKey, keyInfo, ikm, prk, cek, nonce };
}

/** Removes trailing zero padding and the last-record delimiter 0x02 (RFC 8188 Section 2). */
function stripPadding(record: Buffer): Buffer {
  let end = record.length - 1;
  while (end >= 0 && record[end] === 0) end -= 1;
  if (end < 0 || record[end] !== 2) throw new Error("record padding delimiter is not 0x02");
  return record.subarray(0, end);
}

export interface DecryptKeys {
  /** The user agent's P-256 private key, raw 32 bytes (base64url or bytes). */
  privateKey: string | Uint8Array;
  /** The subscription's auth secret (base64url or bytes). */
  auth: string | Uint8Array;
}

const asBytes = (value: string | Uint8Array): Buffer =>
  typeof value === "string" ? Buffer.from(value, "base64url") : Buffer.from(value);

/**
 * Decrypts a Web Push message body as the receiving user agent would (RFC 8291 Section 3, RFC 8188).
 * Takes either `{ privateKey, auth }` or what makeSubscriptionKeys() returned.
 */
export function decryptWebPushPayload(body: Uint8Array, subscriber: DecryptKeys | BrowserSubscriptionKeys): Buffer {
  const keys: DecryptKeys =
    "keys" in subscriber ? { privateKey: subscriber.privateKey, auth: subscriber.keys.auth } : subscriber;
  const header = parseAes128gcmHeader(body);
  if (header.keyId.length !== P256_PUBLIC_KEY_BYTES) {
    throw new Error(`key id is ${header.keyId.length} bytes; Web Push needs the sender's 65-byte key`);
  }
  const ecdh = createECDH("prime256v1");
  ecdh.setPrivateKey(leftPad(asBytes(keys.privateKey), 32));
  const schedule = deriveWebPushKeys({
    ecdhSecret: ecdh.computeSecret(header.keyId),
    authSecret: asBytes(keys.auth),
    uaPublic: ecdh.getPublicKey(),
    asPublic: header.keyId,
    salt: header.salt,
  });
  const record = Buffer.from(body).subarray(header.headerLengthBytes);
  // RFC 8291 Section 4: a push message is a single record, so the record sequence number is 0 and the
  // nonce is used as derived (RFC 8188 Section 2.3).
  if (record.length > header.recordSizeBytes) throw new Error("push message spans more than one record");
  if (record.length <= GCM_TAG_BYTES) throw new Error("aes128gcm record is missing or truncated");
  const decipher = createDecipheriv("aes-128-gcm", schedule.cek, schedule.nonce);
  decipher.setAuthTag(record.subarray(record.length - GCM_TAG_BYTES));
  const plain = Buffer.concat([decipher.update(record.subarray(0, record.length - GCM_TAG_BYTES)), decipher.final()]);
  return stripPadding(plain);
}
