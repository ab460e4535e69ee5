/** The layout drawn on a canvas, to scale, for the PNG download, the printed plan and the chat. */
import type { DesignBlockDto } from '@shared/schemas/designs';
import { blockShapes } from './block-drawing';
import type { Layout } from './layout';
import { isPlain } from './layout';
import { borderColour, SETTING_COLOURS } from './palette';
import { greyCopy, greyOf } from './value-view';
import type { BlockSpec } from '@shared/schemas/blocks';

export interface RenderInput {
  layout: Layout;
  blocks: DesignBlockDto[];
  spec: BlockSpec;
  block: { width: number; height: number };
  valueView: boolean;
  /** pixels on the long side */
  longSide?: number;
}

function loadImage(src: string): Promise<HTMLImageElement | null> {
  return new Promise((resolve) => {
    const img = new Image();
    img.onload = () => resolve(img);
    img.onerror = () => resolve(null);
    img.src = src;
  });
}

/** Draws the whole top: borders, sashing, cornerstones, blocks (turned), plain and empty cells. */
export async function renderWall(input: RenderInput): Promise<HTMLCanvasElement> {
  const { layout: l, block, valueView } = input;
  const s = l.sashing;
  const borderTotal = l.borders.reduce((a, b) => a + b, 0);
  const centreW = l.columns * block.width + (l.columns + 1) * s;
  const centreH = l.rows * block.height + (l.rows + 1) * s;
  const W = centreW + 2 * borderTotal;
  const H = centreH + 2 * borderTotal;
  const scale = (input.longSide ?? 1600) / Math.max(W, H);
  const canvas = document.createElement('canvas');
  canvas.width = Math.round(W * scale);
  canvas.height = Math.round(H * scale);
  const ctx = canvas.getContext('2d')!;
  const paint = (hex: string) => (valueView ? greyOf(hex) : hex);
  const fill = (hex: string, x: number, y: number, w: number, h: number) => {
    ctx.fillStyle = paint(hex);
    ctx.fillRect(x * scale, y * scale, w * scale, h * scale);
  };

  fill('#ffffff', 0, 0, W, H);
  let inset = 0;
  l.borders.forEach((b, i) => {
    fill(borderColour(i).hex, inset, inset, W - 2 * inset, H - 2 * inset);
    inset += b;
  });
  fill(s > 0 ? SETTING_COLOURS.sashing.hex : '#ffffff', inset, inset, centreW, centreH);
  if (s > 0 && l.cornerstones) {
    for (let r = 0; r <= l.rows; r += 1) {
      for (let c = 0; c <= l.columns; c += 1)
        fill(SETTING_COLOURS.cornerstones.hex, inset + c * (block.width + s), inset + r * (block.height + s), s, s);
    }
  }

  const byId = new Map(input.blocks.map((b) => [b.id, b]));
  const images = new Map<number, HTMLImageElement | null>();
  await Promise.all(
    l.cells.map(async (cell) => {
      const b = cell.blockId === null ? undefined : byId.get(cell.blockId);
      if (!b?.photo) return;
      const img = await loadImage(b.photo.thumbUrl);
      images.set(b.id, img && valueView ? await loadImage(greyCopy(img, 480)) : img);
    }),
  );
  const shapes = blockShapes(input.spec);

  l.cells.forEach((cell, i) => {
    const r = Math.floor(i / l.columns);
    const c = i % l.columns;
    const x = (inset + s + c * (block.width + s)) * scale;
    const y = (inset + s + r * (block.height + s)) * scale;
    const w = block.width * scale;
    const h = block.height * scale;
    if (isPlain(l, i)) {
      ctx.fillStyle = paint(SETTING_COLOURS.plain.hex);
      ctx.fillRect(x, y, w, h);
      return;
    }
    if (cell.blockId === null) {
      ctx.fillStyle = '#ffffff';
      ctx.fillRect(x, y, w, h);
      ctx.setLineDash([6, 5]);
      ctx.strokeStyle = '#5a4a3c';
      ctx.lineWidth = 2;
      ctx.strokeRect(x + 3, y + 3, w - 6, h - 6);
      ctx.setLineDash([]);
      return;
    }
    ctx.save();
    ctx.beginPath();
    ctx.rect(x, y, w, h);
    ctx.clip();
    ctx.translate(x + w / 2, y + h / 2);
    ctx.rotate((cell.rotation * Math.PI) / 180);
    const turned = cell.rotation === 90 || cell.rotation === 270;
    const dw = turned ? h : w;
    const dh = turned ? w : h;
    const img = images.get(cell.blockId);
    if (img) {
      // Cover the cell, cropping the photo's edges evenly.
      const k = Math.max(dw / img.naturalWidth, dh / img.naturalHeight);
      ctx.drawImage(img, -(img.naturalWidth * k) / 2, -(img.naturalHeight * k) / 2, img.naturalWidth * k, img.naturalHeight * k);
    } else {
      for (const shape of shapes) {
        ctx.beginPath();
        shape.points.forEach(([px, py], j) =>
          j ? ctx.lineTo(-dw / 2 + px * dw, -dh / 2 + py * dh) : ctx.moveTo(-dw / 2 + px * dw, -dh / 2 + py * dh),
        );
        ctx.closePath();
        ctx.fillStyle = paint(shape.fill);
        ctx.fill();
      }
    }
    ctx.restore();
  });
  return canvas;
}

export function canvasBlob(canvas: HTMLCanvasElement): Promise<Blob> {
  return new Promise((resolve, reject) =>
    canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('The picture could not be made.'))), 'image/png'),
  );
}
