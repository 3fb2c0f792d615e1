/**
 * HEALPix NESTED pixel of a direction, for painting canvases: allocation-free and without the per-call assertions of
 * @hscmap/healpix (which the development console wraps, making a 300 000-pixel canvas take minutes). The algorithm is
 * the reference ang2pix_nest (Górski et al. 2005, ApJ 622, 759, §4 and the HEALPix C library's ang2pix_nest_z_phi).
 */
const TWO_PI = 2 * Math.PI;

/** Spreads the low 16 bits of v to the even bit positions (…b2 0 b1 0 b0). */
function spreadBits(v: number): number {
  let x = v & 0xffff;
  x = (x | (x << 8)) & 0x00ff00ff;
  x = (x | (x << 4)) & 0x0f0f0f0f;
  x = (x | (x << 2)) & 0x33333333;
  x = (x | (x << 1)) & 0x55555555;
  return x;
}

/** z = cos θ = sin δ, phi = RA in radians; nside a power of two up to 2^13. */
export function ang2pixNestZPhi(nside: number, z: number, phi: number): number {
  const za = Math.abs(z);
  let tt = (phi % TWO_PI) / (Math.PI / 2);
  if (tt < 0) tt += 4;
  let face: number;
  let ix: number;
  let iy: number;
  if (za <= 2 / 3) {
    // equatorial belt
    const temp1 = nside * (0.5 + tt);
    const temp2 = nside * z * 0.75;
    const jp = Math.floor(temp1 - temp2);
    const jm = Math.floor(temp1 + temp2);
    const ifp = Math.floor(jp / nside);
    const ifm = Math.floor(jm / nside);
    face = ifp === ifm ? ifp | 4 : ifp < ifm ? ifp : ifm + 8;
    ix = jm & (nside - 1);
    iy = nside - (jp & (nside - 1)) - 1;
  } else {
    // polar caps
    const ntt = Math.min(3, Math.floor(tt));
    const tp = tt - ntt;
    const tmp = nside * Math.sqrt(3 * (1 - za));
    const jp = Math.min(nside - 1, Math.floor(tp * tmp));
    const jm = Math.min(nside - 1, Math.floor((1 - tp) * tmp));
    if (z >= 0) {
      face = ntt;
      ix = nside - jm - 1;
      iy = nside - jp - 1;
    } else {
      face = ntt + 8;
      ix = jp;
      iy = jm;
    }
  }
  return face * nside * nside + spreadBits(ix) + 2 * spreadBits(iy);
}

export function raDecToNest(nside: number, raDeg: number, decDeg: number): number {
  return ang2pixNestZPhi(nside, Math.sin((decDeg * Math.PI) / 180), (raDeg * Math.PI) / 180);
}
