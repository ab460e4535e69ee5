/** The value view: pictures shown in CIE L* only, as quilters check contrast with a grey photo. */
import { greyForLightness, rgbToLab, srgbToLab } from '@shared/colour';
import type { Shape } from './block-drawing';

/** Each pixel replaced by the sRGB grey of its own L* (not the luma a "greyscale" filter uses). */
export function greyCopy(img: HTMLImageElement, maxSide = 200): string {
  const scale = Math.min(1, maxSide / Math.max(img.naturalWidth, img.naturalHeight));
  const w = Math.max(1, Math.round(img.naturalWidth * scale));
  const h = Math.max(1, Math.round(img.naturalHeight * scale));
  const canvas = document.createElement('canvas');
  canvas.width = w;
  canvas.height = h;
  const ctx = canvas.getContext('2d', { willReadFrequently: true })!;
  ctx.drawImage(img, 0, 0, w, h);
  const data = ctx.getImageData(0, 0, w, h);
  const px = data.data;
  const cache = new Map<number, number>();
  for (let i = 0; i < px.length; i += 4) {
    const key = (px[i]! << 16) | (px[i + 1]! << 8) | px[i + 2]!;
    let v = cache.get(key);
    if (v === undefined) {
      v = parseInt(greyForLightness(rgbToLab(px[i]!, px[i + 1]!, px[i + 2]!)[0]).slice(1, 3), 16);
      cache.set(key, v);
    }
    px[i] = v;
    px[i + 1] = v;
    px[i + 2] = v;
  }
  ctx.putImageData(data, 0, 0);
  return canvas.toDataURL('image/png');
}

/** A fill colour shown as the grey of its lightness. */
export const greyOf = (hex: string) => greyForLightness(srgbToLab(hex)[0]);
export const lightnessOf = (hex: string) => srgbToLab(hex)[0];

function area(points: [number, number][]): number {
  let s = 0;
  points.forEach(([x, y], i) => {
    const [x2, y2] = points[(i + 1) % points.length]!;
    s += x * y2 - x2 * y;
  });
  return Math.abs(s) / 2;
}

/** Mean L* of a drawing, by the area of each shape (later shapes cover earlier ones). */
export function drawingLightness(shapes: Shape[]): number {
  // Shapes drawn on top of a full background (geese, square-in-square) cover part of it.
  const total = shapes.reduce((s, x) => s + area(x.points), 0);
  if (shapes.length > 1 && Math.abs(area(shapes[0]!.points) - 1) < 1e-9 && total > 1 + 1e-9) {
    const top = shapes.slice(1).reduce((s, x) => s + area(x.points) * lightnessOf(x.fill), 0);
    const covered = shapes.slice(1).reduce((s, x) => s + area(x.points), 0);
    return top + (1 - covered) * lightnessOf(shapes[0]!.fill);
  }
  return shapes.reduce((s, x) => s + area(x.points) * lightnessOf(x.fill), 0) / total;
}
