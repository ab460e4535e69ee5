/**
 * Plane-to-plane homography from four point pairs by the direct linear transform: with h₃₃ = 1 the
 * eight unknowns solve an 8 × 8 linear system (Gaussian elimination with partial pivoting) on
 * Hartley-normalised coordinates. Matrices are row-major number[9]: [h11 h12 h13 h21 … h33].
 */
import { QuiltInputError } from './rational';

export type Point = [number, number];
export type Quad = [Point, Point, Point, Point];
export type Homography = number[];

export function pointsArg(field: string, pts: unknown): Quad {
  const ok =
    Array.isArray(pts) &&
    pts.length === 4 &&
    pts.every((p) => Array.isArray(p) && p.length === 2 && p.every((c) => typeof c === 'number' && Number.isFinite(c)));
  if (!ok) throw new QuiltInputError(field, 'Give exactly four corners, each as [x, y] numbers.');
  return pts as Quad;
}

/** Twice the signed area of triangle abc. */
const cross = (a: Point, b: Point, c: Point): number => (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);

/** Throws when three of the four points are (nearly) on one line: no homography exists then. */
function assertGeneralPosition(field: string, pts: Quad): void {
  const span = Math.max(...pts.flatMap((p) => pts.map((r) => Math.hypot(p[0] - r[0], p[1] - r[1]))));
  for (let skip = 0; skip < 4; skip += 1) {
    const [a, b, c] = pts.filter((_, i) => i !== skip) as [Point, Point, Point];
    if (!(Math.abs(cross(a, b, c)) > 1e-9 * span * span)) {
      throw new QuiltInputError(field, 'Three of the four corners lie on one line; click the four corners of the square.');
    }
  }
}

/** Solves A·x = b in place (n × n, row-major) by Gaussian elimination with partial pivoting. */
export function solveLinear(A: number[][], b: number[]): number[] {
  const n = b.length;
  for (let col = 0; col < n; col += 1) {
    let pivot = col;
    for (let r = col + 1; r < n; r += 1)
      if (Math.abs((A[r] as number[])[col] as number) > Math.abs((A[pivot] as number[])[col] as number)) pivot = r;
    const pivotRow = A[pivot] as number[];
    const pv = pivotRow[col] as number;
    if (Math.abs(pv) < 1e-12)
      throw new QuiltInputError('corners', 'The corners do not define a plane mapping (they are degenerate).');
    [A[col], A[pivot]] = [pivotRow, A[col] as number[]];
    [b[col], b[pivot]] = [b[pivot] as number, b[col] as number];
    for (let r = col + 1; r < n; r += 1) {
      const row = A[r] as number[];
      const f = (row[col] as number) / pv;
      if (f === 0) continue;
      for (let c = col; c < n; c += 1) row[c] = (row[c] as number) - f * (pivotRow[c] as number);
      b[r] = (b[r] as number) - f * (b[col] as number);
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r -= 1) {
    const row = A[r] as number[];
    let s = b[r] as number;
    for (let c = r + 1; c < n; c += 1) s -= (row[c] as number) * (x[c] as number);
    x[r] = s / (row[r] as number);
  }
  return x;
}

/** Similarity T moving the centroid to 0 and the mean distance to √2 (Hartley normalisation). */
function normaliser(pts: Quad): Homography {
  const cx = pts.reduce((s, p) => s + p[0], 0) / 4;
  const cy = pts.reduce((s, p) => s + p[1], 0) / 4;
  const mean = pts.reduce((s, p) => s + Math.hypot(p[0] - cx, p[1] - cy), 0) / 4;
  const k = Math.SQRT2 / mean;
  return [k, 0, -k * cx, 0, k, -k * cy, 0, 0, 1];
}

export function multiply(a: Homography, b: Homography): Homography {
  const out = new Array<number>(9).fill(0);
  for (let r = 0; r < 3; r += 1) {
    for (let c = 0; c < 3; c += 1) {
      let s = 0;
      for (let k = 0; k < 3; k += 1) s += (a[3 * r + k] as number) * (b[3 * k + c] as number);
      out[3 * r + c] = s;
    }
  }
  return out;
}

/** Inverse of a similarity built by `normaliser`. */
function invertNormaliser(t: Homography): Homography {
  const k = t[0] as number;
  return [1 / k, 0, -(t[2] as number) / k, 0, 1 / k, -(t[5] as number) / k, 0, 0, 1];
}

/** The 3 × 3 matrix H (row-major, h33 = 1 where possible) with H·src[i] ∝ dst[i]. */
export function homography(src: Quad, dst: Quad): Homography {
  const s = pointsArg('src', src);
  const d = pointsArg('dst', dst);
  assertGeneralPosition('src', s);
  assertGeneralPosition('dst', d);
  const ts = normaliser(s);
  const td = normaliser(d);
  const ns = s.map((p) => applyHomography(ts, p)) as Quad;
  const nd = d.map((p) => applyHomography(td, p)) as Quad;
  const A: number[][] = [];
  const b: number[] = [];
  for (let i = 0; i < 4; i += 1) {
    const [x, y] = ns[i] as Point;
    const [u, v] = nd[i] as Point;
    A.push([x, y, 1, 0, 0, 0, -x * u, -y * u]);
    b.push(u);
    A.push([0, 0, 0, x, y, 1, -x * v, -y * v]);
    b.push(v);
  }
  const h = solveLinear(A, b);
  const H = multiply(invertNormaliser(td), multiply([...h, 1], ts));
  const scale = Math.abs(H[8] as number) > 1e-12 ? (H[8] as number) : Math.hypot(...H);
  return H.map((v) => v / scale);
}

/** Maps a point through H (row-major number[9] or 3 × 3 rows). */
export function applyHomography(h: Homography | number[][], [x, y]: Point): Point {
  const m = (Array.isArray(h[0]) ? (h as number[][]).flat() : h) as number[];
  if (m.length !== 9) throw new QuiltInputError('h', 'A homography has nine entries.');
  const w = (m[6] as number) * x + (m[7] as number) * y + (m[8] as number);
  if (Math.abs(w) < 1e-15)
    throw new QuiltInputError('point', 'The point maps to infinity (it lies on the horizon of the plane).');
  return [
    ((m[0] as number) * x + (m[1] as number) * y + (m[2] as number)) / w,
    ((m[3] as number) * x + (m[4] as number) * y + (m[5] as number)) / w,
  ];
}

/** True when the quad's corners go round in order (convex, no crossing). */
export function isConvexQuad(pts: Quad): boolean {
  const signs = pts.map((p, i) => Math.sign(cross(p, pts[(i + 1) % 4] as Point, pts[(i + 2) % 4] as Point)));
  return signs.every((s) => s !== 0 && s === signs[0]);
}
