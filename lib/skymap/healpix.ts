/**
 * HEALPix index arithmetic (Górski et al. 2005, ApJ 622, 759). The @hscmap/healpix package supplies
 * the pixel geometry (fxy2tu / tu2za, pix2vec); written here are only what it lacks or does too
 * slowly for millions of pixels: an allocation-free RING→NESTED index, NUNIQ decoding (its own uniq
 * helpers use a different packing), pixel centres up to order 24, and the disc query in disc.ts.
 */
import { fxy2tu, nest2ring, pix2vec_nest, pix2vec_ring, tu2za } from "@hscmap/healpix";
import type { V3 } from "@hscmap/healpix";

export { nest2ring, pix2vec_nest, pix2vec_ring, type V3 };

/** Finest order accepted: NUNIQ values stay below 2^53 (exact doubles) up to here. */
export const MAX_ORDER = 24;

export function nside2npix(nside: number): number {
  return 12 * nside * nside;
}

/** log2(nside) when nside is a power of two in 1 … 2^MAX_ORDER, else undefined. */
export function nsideToOrder(nside: number): number | undefined {
  if (!Number.isInteger(nside) || nside < 1 || nside > 2 ** MAX_ORDER) return undefined;
  const order = Math.round(Math.log2(nside));
  return 2 ** order === nside ? order : undefined;
}

/** 4^order for order 0 … MAX_ORDER, exact; a table because Math.pow is slow in per-pixel loops. */
export const POW4 = Float64Array.from({ length: MAX_ORDER + 1 }, (_, order) => 4 ** order);
const AREA_SR = POW4.map((p) => Math.PI / (3 * p));

/** Pixel solid angle at an order: 4π / (12 · 4^order) sr (Górski et al. 2005, §4). */
export function pixelAreaSr(order: number): number {
  return AREA_SR[order] ?? Math.PI / (3 * 4 ** order);
}

export const SR_TO_DEG2 = (180 / Math.PI) ** 2;

/** Unit vector of an equatorial position (theta = 90° − dec, phi = ra). */
export function raDecToVec(raDeg: number, decDeg: number): V3 {
  const ra = (raDeg * Math.PI) / 180;
  const dec = (decDeg * Math.PI) / 180;
  return [Math.cos(dec) * Math.cos(ra), Math.cos(dec) * Math.sin(ra), Math.sin(dec)];
}

export function vecToRaDec(v: V3): { raDeg: number; decDeg: number } {
  const [x, y, z] = v;
  const raDeg = ((Math.atan2(y, x) * 180) / Math.PI + 360) % 360;
  const decDeg = (Math.atan2(z, Math.hypot(x, y)) * 180) / Math.PI;
  return { raDeg, decDeg };
}

const TWO_POW_32 = 4294967296;

/**
 * NUNIQ scheme: uniq = 4 · 4^order + ipix (HEALPix primer; Górski et al. 2005), so
 * order = ⌊(⌊log2 uniq⌋ − 2) / 2⌋. Returns undefined for values that are not a valid uniq ≤ MAX_ORDER.
 */
export function decodeUniq(uniq: number): { order: number; ipix: number } | undefined {
  const order = uniqOrder(uniq);
  return order < 0 ? undefined : { order, ipix: uniq - 4 * (POW4[order] ?? 0) };
}

/** The order of a NUNIQ value, or −1 when it is not one (allocation-free form of decodeUniq). */
export function uniqOrder(uniq: number): number {
  if (!Number.isSafeInteger(uniq) || uniq < 4) return -1;
  const log2 = uniq < TWO_POW_32 ? 31 - Math.clz32(uniq) : 63 - Math.clz32(Math.floor(uniq / TWO_POW_32));
  const order = (log2 - 2) >> 1;
  return order > MAX_ORDER ? -1 : order;
}

function spreadBits16(v: number): number {
  v &= 0xffff;
  v = (v | (v << 8)) & 0x00ff00ff;
  v = (v | (v << 4)) & 0x0f0f0f0f;
  v = (v | (v << 2)) & 0x33333333;
  return (v | (v << 1)) & 0x55555555;
}

function compactBits32(v: number): number {
  v &= 0x55555555;
  v = (v | (v >>> 1)) & 0x33333333;
  v = (v | (v >>> 2)) & 0x0f0f0f0f;
  v = (v | (v >>> 4)) & 0x00ff00ff;
  return (v | (v >>> 8)) & 0x0000ffff;
}

const JPLL = [1, 3, 5, 7, 0, 2, 4, 6, 1, 3, 5, 7];
const JRLL = [2, 2, 2, 2, 3, 3, 3, 3, 4, 4, 4, 4];

/**
 * RING index and centre (z = cos θ, φ in radians) of a NESTED pixel, nside ≤ 2^15, written into out[0], out[1],
 * out[2] without allocating: face and in-face (x, y) by bit de-interleaving, then the ring number and the position
 * in the ring (HEALPix nest2xyf and pix2loc; Górski et al. 2005, ApJ 622, 759, §4).
 */
export function nestToRingCentre(nside: number, pix: number, out: Float64Array): void {
  const perFace = nside * nside;
  const face = Math.floor(pix / perFace);
  const inFace = pix - face * perFace;
  const ix = compactBits32(inFace);
  const iy = compactBits32(inFace >>> 1);
  const jr = (JRLL[face] ?? 0) * nside - ix - iy - 1; // ring number, 1 … 4·nside − 1
  let nr: number, z: number, kshift: number, ringStart: number;
  if (jr < nside) {
    nr = jr;
    z = 1 - (nr * nr) / (3 * perFace);
    kshift = 0;
    ringStart = 2 * nr * (nr - 1);
  } else if (jr > 3 * nside) {
    nr = 4 * nside - jr;
    z = (nr * nr) / (3 * perFace) - 1;
    kshift = 0;
    ringStart = 12 * perFace - 2 * nr * (nr + 1);
  } else {
    nr = nside;
    z = 4 / 3 - (2 * jr) / (3 * nside); // the ring heights of disc.ts, to the last bit
    kshift = (jr - nside) & 1;
    ringStart = 2 * nside * (nside - 1) + (jr - nside) * 4 * nside;
  }
  let jp = ((JPLL[face] ?? 0) * nr + ix - iy + 1 + kshift) / 2; // position in the ring, 1 … 4·nr
  if (jp > 4 * nr) jp -= 4 * nr;
  if (jp < 1) jp += 4 * nr;
  out[0] = ringStart + jp - 1;
  out[1] = z;
  out[2] = (jp - (kshift + 1) * 0.5) * (Math.PI / (2 * nr));
}

/**
 * RING → NESTED index for nside ≤ 2^15 without allocating (ring2xyf of Górski et al. 2005, §4,
 * followed by bit interleaving), so whole maps can be reordered quickly.
 */
export function ringToNest(nside: number, pix: number): number {
  const ncap = 2 * nside * (nside - 1);
  const npix = 12 * nside * nside;
  const nl2 = 2 * nside;
  let iring: number, iphi: number, kshift: number, nr: number, face: number;
  if (pix < ncap) {
    iring = (1 + isqrt(1 + 2 * pix)) >> 1;
    iphi = pix + 1 - 2 * iring * (iring - 1);
    kshift = 0;
    nr = iring;
    face = Math.floor((iphi - 1) / nr);
  } else if (pix < npix - ncap) {
    const ip = pix - ncap;
    const tmp = Math.floor(ip / (4 * nside));
    iring = tmp + nside;
    iphi = ip - tmp * 4 * nside + 1;
    kshift = (iring + nside) & 1;
    nr = nside;
    const ifm = Math.floor((iphi - ((tmp + 1) >> 1) + nside - 1) / nside);
    const ifp = Math.floor((iphi - ((nl2 + 1 - tmp) >> 1) + nside - 1) / nside);
    face = ifp === ifm ? ifp | 4 : ifp < ifm ? ifp : ifm + 8;
  } else {
    const ip = npix - pix;
    const ringFromSouth = (1 + isqrt(2 * ip - 1)) >> 1;
    iphi = 4 * ringFromSouth + 1 - (ip - 2 * ringFromSouth * (ringFromSouth - 1));
    kshift = 0;
    nr = ringFromSouth;
    iring = 2 * nl2 - ringFromSouth;
    face = Math.floor((iphi - 1) / nr) + 8;
  }
  const irt = iring - (2 + (face >> 2)) * nside + 1;
  let ipt = 2 * iphi - (JPLL[face] ?? 0) * nr - kshift - 1;
  if (ipt >= nl2) ipt -= 8 * nside;
  const x = (ipt - irt) >> 1;
  const y = (-ipt - irt) >> 1;
  return face * nside * nside + spreadBits16(x) + 2 * spreadBits16(y);
}

function isqrt(v: number): number {
  let r = Math.floor(Math.sqrt(v));
  while (r * r > v) r--;
  while ((r + 1) * (r + 1) <= v) r++;
  return r;
}

/** Centre of a NESTED pixel of any order ≤ MAX_ORDER as a unit vector (geometry from @hscmap/healpix). */
export function nestCentreVec(order: number, ipix: number): V3 {
  const nside = 2 ** order;
  const perFace = nside * nside;
  const face = Math.floor(ipix / perFace);
  const k = ipix - face * perFace;
  const lo = k % TWO_POW_32;
  const hi = Math.floor(k / TWO_POW_32);
  const x = compactBits32(lo) + compactBits32(hi) * 65536;
  const y = compactBits32(lo >>> 1) + compactBits32(hi >>> 1) * 65536;
  const { t, u } = fxy2tu(nside, face, x, y);
  const { z, a } = tu2za(t, u);
  const s = Math.sqrt(1 - z * z);
  return [s * Math.cos(a), s * Math.sin(a), z];
}
