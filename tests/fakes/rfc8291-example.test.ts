// Checks the browser-side Web Push decryption against the worked example of RFC 8291
// (Section 5, intermediate values in Appendix A). The base64url strings below are the RFC's,
// typed from it (cross-checked against stored public copies of the example; no network here).
import { createECDH } from "node:crypto";
import { describe, expect, it } from "vitest";
import { decryptWebPushPayload, deriveWebPushKeys, makeSubscriptionKeys, parseAes128gcmHeader } from "@/fakes/push/decrypt";

const b64 = (text: string): Buffer => Buffer.from(text, "base64url");

// RFC 8291 Section 5 / Appendix A.
const RFC8291 = {
  plaintext: "When I grow up, I want to be a watermelon",
  asPublic: "BP4z9KsN6nGRTbVYI_c7VJSPQTBtkgcy27mlmlMoZIIgDll6e3vCYLocInmYWAmS6TlzAC8wEqKK6PBru3jl7A8",
  asPrivate: "yfWPiYE-n46HLnH0KqZOF1fJJU3MYrct3AELtAQ-oRw",
  uaPublic: "BCVxsr7N_eNgVRqvHtD0zTZsEc6-VV-JvLexhqUzORcxaOzi6-AYWXvTBHm4bjyPjs7Vd8pZGH6SRpkNtoIAiw4",
  uaPrivate: "q1dXpw3UpT5VOmu_cf_v6ih07Aems3njxI-JWgLcM94",
  authSecret: "BTBZMqHH6r4Tts7J_aSIgg",
  salt: "DGv6ra1nlYgDCS1FRnbzlw",
  ecdhSecret: "kyrL1jIIOHEzg3sM2ZWRHDRB62YACZhhSlknJ672kSs",
  prkKey: "Snr3JMxaHVDXHWJn5wdC52WjpCtd2EIEGBykDcZW32k",
  keyInfo:
    "V2ViUHVzaDogaW5mbwAEJXGyvs3942BVGq8e0PTNNmwRzr5VX4m8t7GGpTM5FzFo7OLr4BhZe9MEebhuPI-OztV3ylkYfpJGmQ22ggCLDgT-" +
    "M_SrDepxkU21WCP3O1SUj0EwbZIHMtu5pZpTKGSCIA5Zent7wmC6HCJ5mFgJkuk5cwAvMBKiiujwa7t45ewP",
  ikm: "S4lYMb_L0FxCeq0WhDx813KgSYqU26kOyzWUdsXYyrg",
  prk: "09_eUZGrsvxChDCGRCdkLiDXrReGOEVeSCdCcPBSJSc",
  cek: "oIhVW04MRdy2XN9CiKLxTg",
  nonce: "4h_95klXJ5E_qnoN",
  body:
    "DGv6ra1nlYgDCS1FRnbzlwAAEABBBP4z9KsN6nGRTbVYI_c7VJSPQTBtkgcy27ml" +
    "mlMoZIIgDll6e3vCYLocInmYWAmS6TlzAC8wEqKK6PBru3jl7A_yl95bQpu6cVPT" +
    "pK4Mqgkf1CXztLVBSt2Ks3oZwbuwXPXLWyouBWLVWGNWQexSgSxsj_Qulcy4a-fN",
};

describe("RFC 8291 worked example", () => {
  it("decrypts the example message to the example plaintext", () => {
    const plaintext = decryptWebPushPayload(b64(RFC8291.body), {
      privateKey: RFC8291.uaPrivate,
      auth: RFC8291.authSecret,
    });
    expect(plaintext.toString("utf8")).toBe(RFC8291.plaintext);
  });

  it("parses the example header: salt, rs 4096, and the sender's key as keyid", () => {
    const header = parseAes128gcmHeader(b64(RFC8291.body));
    expect(header.salt.toString("base64url")).toBe(RFC8291.salt);
    expect(header.recordSizeBytes).toBe(4096);
    expect(header.keyId.toString("base64url")).toBe(RFC8291.asPublic);
    expect(header.headerLengthBytes).toBe(86);
  });

  it("reproduces every intermediate value of Appendix A", () => {
    const ua = createECDH("prime256v1");
    ua.setPrivateKey(b64(RFC8291.uaPrivate));
    expect(ua.getPublicKey().toString("base64url")).toBe(RFC8291.uaPublic);
    const ecdhSecret = ua.computeSecret(b64(RFC8291.asPublic));
    expect(ecdhSecret.toString("base64url")).toBe(RFC8291.ecdhSecret);
    // The sender's view of the same agreement gives the same secret.
    const as = createECDH("prime256v1");
    as.setPrivateKey(b64(RFC8291.asPrivate));
    expect(as.getPublicKey().toString("base64url")).toBe(RFC8291.asPublic);
    expect(as.computeSecret(b64(RFC8291.uaPublic)).toString("base64url")).toBe(RFC8291.ecdhSecret);

    const schedule = deriveWebPushKeys({
      ecdhSecret,
      authSecret: b64(RFC8291.authSecret),
      uaPublic: b64(RFC8291.uaPublic),
      asPublic: b64(RFC8291.asPublic),
      salt: b64(RFC8291.salt),
    });
    expect(schedule.prkKey.toString("base64url")).toBe(RFC8291.prkKey);
    expect(schedule.keyInfo.toString("base64url")).toBe(RFC8291.keyInfo);
    expect(schedule.ikm.toString("base64url")).toBe(RFC8291.ikm);
    expect(schedule.prk.toString("base64url")).toBe(RFC8291.prk);
    expect(schedule.cek.toString("base64url")).toBe(RFC8291.cek);
    expect(schedule.nonce.toString("base64url")).toBe(RFC8291.nonce);
  });

  it("refuses a tampered ciphertext, a wrong auth secret and a wrong private key", () => {
    const body = b64(RFC8291.body);
    const tampered = Buffer.from(body);
    tampered[100] = (tampered[100] ?? 0) ^ 0x01;
    const keys = { privateKey: RFC8291.uaPrivate, auth: RFC8291.authSecret };
    expect(() => decryptWebPushPayload(tampered, keys)).toThrow();
    expect(() => decryptWebPushPayload(body, { ...keys, auth: Buffer.alloc(16, 7) })).toThrow();
    expect(() => decryptWebPushPayload(body, { ...keys, privateKey: makeSubscriptionKeys().privateKey })).toThrow();
  });

  it("refuses bodies whose header is cut short", () => {
    const keys = { privateKey: RFC8291.uaPrivate, auth: RFC8291.authSecret };
    expect(() => decryptWebPushPayload(b64(RFC8291.body).subarray(0, 20), keys)).toThrow(/header/);
    expect(() => decryptWebPushPayload(b64(RFC8291.body).subarray(0, 90), keys)).toThrow(/truncated/);
  });
});

describe("makeSubscriptionKeys", () => {
  it("gives a 65-byte uncompressed P-256 p256dh, a 16-byte auth and the matching 32-byte private key", () => {
    for (let i = 0; i < 20; i += 1) {
      const made = makeSubscriptionKeys();
      const p256dh = b64(made.keys.p256dh);
      expect(p256dh.length).toBe(65);
      expect(p256dh[0]).toBe(0x04);
      expect(b64(made.keys.auth).length).toBe(16);
      expect(b64(made.privateKey).length).toBe(32);
      const ecdh = createECDH("prime256v1");
      ecdh.setPrivateKey(b64(made.privateKey));
      expect(ecdh.getPublicKey().toString("base64url")).toBe(made.keys.p256dh);
    }
  });
});
