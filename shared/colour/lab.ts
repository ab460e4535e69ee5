/**
 * Colour arithmetic for the design wall: sRGB (IEC 61966-2-1) to CIE 1976 L*a*b* with the D65
 * white, and the CIEDE2000 colour difference. Pure functions, no I/O.
 */

/** CIE 1976 L*a*b*: L* 0–100, a* and b* roughly −128…128. */
export type Lab = readonly [number, number, number];

const HEX = /^#?([0-9a-f]{3}|[0-9a-f]{6})$/i;

/** Parses `#rgb` or `#rrggbb` (the `#` optional) into 0–255 channels; throws RangeError otherwise. */
export function parseHex(hex: string): [number, number, number] {
  const m = HEX.exec(hex.trim());
  if (!m) throw new RangeError(`Not a hex colour: ${JSON.stringify(hex.slice(0, 20))}`);
  const h = m[1]!.length === 3 ? [...m[1]!].map((c) => c + c).join('') : m[1]!;
  return [parseInt(h.slice(0, 2), 16), parseInt(h.slice(2, 4), 16), parseInt(h.slice(4, 6), 16)];
}

/** An 8-bit sRGB channel to linear light (the IEC 61966-2-1 transfer function). */
export function srgbChannelToLinear(c255: number): number {
  const c = c255 / 255;
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

// Linear sRGB to CIE XYZ, the four-decimal matrix of IEC 61966-2-1; its row sums are the D65
// white, so sRGB white lands on L* = 100, a* = b* = 0 exactly.
const M = [
  [0.4124, 0.3576, 0.1805],
  [0.2126, 0.7152, 0.0722],
  [0.0193, 0.1192, 0.9505],
] as const;
const WHITE = M.map((row) => row[0] + row[1] + row[2]) as [number, number, number];
const EPSILON = (6 / 29) ** 3;
const f = (t: number) => (t > EPSILON ? Math.cbrt(t) : t / (3 * (6 / 29) ** 2) + 4 / 29);

/** Linear-light RGB (0–1 each) to L*a*b* (D65). */
export function linearRgbToLab(r: number, g: number, b: number): [number, number, number] {
  const fx = f((M[0][0] * r + M[0][1] * g + M[0][2] * b) / WHITE[0]);
  const fy = f((M[1][0] * r + M[1][1] * g + M[1][2] * b) / WHITE[1]);
  const fz = f((M[2][0] * r + M[2][1] * g + M[2][2] * b) / WHITE[2]);
  return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}

/** 8-bit sRGB channels to L*a*b* (D65). */
export function rgbToLab(r: number, g: number, b: number): [number, number, number] {
  return linearRgbToLab(srgbChannelToLinear(r), srgbChannelToLinear(g), srgbChannelToLinear(b));
}

/** A hex colour (`#rrggbb` or `#rgb`) to CIE 1976 L*a*b* with the D65 white. */
export function srgbToLab(hex: string): [number, number, number] {
  const [r, g, b] = parseHex(hex);
  return rgbToLab(r, g, b);
}

/** L* to the sRGB grey of the same lightness, as `#rrggbb` (for the value view). */
export function greyForLightness(L: number): string {
  const fy = (Math.min(100, Math.max(0, L)) + 16) / 116;
  const y = fy > 6 / 29 ? fy ** 3 : 3 * (6 / 29) ** 2 * (fy - 4 / 29);
  const c = y <= 0.0031308 ? 12.92 * y : 1.055 * y ** (1 / 2.4) - 0.055;
  const v = Math.round(Math.min(1, Math.max(0, c)) * 255);
  return `#${v.toString(16).padStart(2, '0').repeat(3)}`;
}

const DEG = Math.PI / 180;
const POW25_7 = 25 ** 7;

/**
 * The CIEDE2000 colour difference between two L*a*b* colours (kL = kC = kH = 1), following the
 * steps and the hue conventions of Sharma, Wu and Dalal's implementation notes: hue 0 for a
 * neutral colour, and the mean hue taken as the sum when either chroma is zero. Symmetric.
 */
export function deltaE2000(lab1: Lab, lab2: Lab): number {
  const [L1, a1, b1] = lab1;
  const [L2, a2, b2] = lab2;
  const Cab = (Math.hypot(a1, b1) + Math.hypot(a2, b2)) / 2;
  const Cab7 = Cab ** 7;
  const G = 0.5 * (1 - Math.sqrt(Cab7 / (Cab7 + POW25_7)));
  const a1p = (1 + G) * a1;
  const a2p = (1 + G) * a2;
  const C1 = Math.hypot(a1p, b1);
  const C2 = Math.hypot(a2p, b2);
  const hue = (b: number, ap: number) => {
    if (b === 0 && ap === 0) return 0;
    const h = Math.atan2(b, ap) / DEG;
    return h < 0 ? h + 360 : h;
  };
  const h1 = hue(b1, a1p);
  const h2 = hue(b2, a2p);

  const dL = L2 - L1;
  const dC = C2 - C1;
  let dh = 0;
  if (C1 * C2 !== 0) {
    dh = h2 - h1;
    if (dh > 180) dh -= 360;
    else if (dh < -180) dh += 360;
  }
  const dH = 2 * Math.sqrt(C1 * C2) * Math.sin((dh / 2) * DEG);

  const Lm = (L1 + L2) / 2;
  const Cm = (C1 + C2) / 2;
  let hm = h1 + h2;
  if (C1 * C2 !== 0) {
    if (Math.abs(h1 - h2) <= 180) hm /= 2;
    else hm = hm < 360 ? (hm + 360) / 2 : (hm - 360) / 2;
  }
  const T =
    1 -
    0.17 * Math.cos((hm - 30) * DEG) +
    0.24 * Math.cos(2 * hm * DEG) +
    0.32 * Math.cos((3 * hm + 6) * DEG) -
    0.2 * Math.cos((4 * hm - 63) * DEG);
  const dTheta = 30 * Math.exp(-(((hm - 275) / 25) ** 2));
  const Cm7 = Cm ** 7;
  const RC = 2 * Math.sqrt(Cm7 / (Cm7 + POW25_7));
  const Lm50 = (Lm - 50) ** 2;
  const SL = 1 + (0.015 * Lm50) / Math.sqrt(20 + Lm50);
  const SC = 1 + 0.045 * Cm;
  const SH = 1 + 0.015 * Cm * T;
  const RT = -Math.sin(2 * dTheta * DEG) * RC;
  const l = dL / SL;
  const c = dC / SC;
  const h = dH / SH;
  return Math.sqrt(l * l + c * c + h * h + RT * c * h);
}
