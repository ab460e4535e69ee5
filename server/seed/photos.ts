/**
 * Demo photos of finished blocks, drawn here (no downloaded pictures): a pieced block in the
 * product's dye palette lying slightly askew on a cutting mat with a one-inch grid, rendered from
 * SVG to JPEG with sharp and stored through the same pipeline as members' uploads.
 */
import sharp from 'sharp';
import type { Sequelize } from 'sequelize';
import { storePhotos, type PhotoStoreDeps } from '../uploads/photo-store';

export const demoDesigns = ['nine-patch', 'pinwheel', 'flying-geese', 'square-in-a-square'] as const;
export type DemoDesign = (typeof demoDesigns)[number];

const palette = {
  linen: '#F7F3EA',
  walnut: '#2B2118',
  indigo: '#2F4B7C',
  madder: '#B5462F',
  weld: '#C8920F',
  lichen: '#5F7A5A',
  plum: '#6B3F69',
};
const darks = [palette.indigo, palette.madder, palette.plum, palette.lichen, palette.walnut];
const mediums = [palette.weld, palette.lichen, palette.madder, palette.indigo];

const PX_PER_INCH = 80;
const WIDTH = 1600;
const HEIGHT = 1200;
const BLOCK = 9.5 * PX_PER_INCH; // a 9" finished block with its seam allowance

/** A small deterministic generator, so the same block always gets the same picture. */
function random(seed: number) {
  let s = (seed * 2654435761) >>> 0 || 1;
  return () => {
    s ^= s << 13;
    s ^= s >>> 17;
    s ^= s << 5;
    return (s >>> 0) / 4294967296;
  };
}

function patches(design: DemoDesign, dark: string, medium: string, light: string): string {
  const u = BLOCK / 6;
  const seam = 'stroke="#00000022" stroke-width="2"';
  const rect = (x: number, y: number, w: number, h: number, fill: string) =>
    `<rect x="${x}" y="${y}" width="${w}" height="${h}" fill="${fill}" ${seam}/>`;
  const tri = (points: number[][], fill: string) =>
    `<polygon points="${points.map((p) => p.join(',')).join(' ')}" fill="${fill}" ${seam}/>`;
  const out: string[] = [];
  switch (design) {
    case 'nine-patch':
      for (let r = 0; r < 3; r++)
        for (let c = 0; c < 3; c++) out.push(rect(c * 2 * u, r * 2 * u, 2 * u, 2 * u, (r + c) % 2 === 0 ? dark : light));
      out.push(rect(2 * u, 2 * u, 2 * u, 2 * u, medium));
      break;
    case 'pinwheel': {
      const h = BLOCK / 2;
      // Four half-square triangle units turning around the centre.
      const quads: [number, number, number][] = [
        [0, 0, 0],
        [h, 0, 1],
        [h, h, 2],
        [0, h, 3],
      ];
      for (const [x, y, turn] of quads) {
        const corners = [
          [x, y],
          [x + h, y],
          [x + h, y + h],
          [x, y + h],
        ];
        const a = corners[turn]!,
          b = corners[(turn + 1) % 4]!,
          c = corners[(turn + 2) % 4]!,
          d = corners[(turn + 3) % 4]!;
        out.push(tri([a, b, c], light), tri([a, c, d], turn % 2 ? dark : medium));
      }
      break;
    }
    case 'flying-geese':
      for (let row = 0; row < 4; row++) {
        const y = (row * BLOCK) / 4;
        const h = BLOCK / 4;
        out.push(
          rect(0, y, BLOCK, h, light),
          tri(
            [
              [0, y + h],
              [BLOCK / 2, y],
              [BLOCK, y + h],
            ],
            row % 2 ? dark : medium,
          ),
        );
      }
      break;
    case 'square-in-a-square': {
      const m = BLOCK / 2;
      out.push(
        rect(0, 0, BLOCK, BLOCK, dark),
        tri(
          [
            [m, 0],
            [BLOCK, m],
            [m, BLOCK],
            [0, m],
          ],
          light,
        ),
      );
      out.push(
        tri(
          [
            [m, BLOCK / 4],
            [BLOCK * 0.75, m],
            [m, BLOCK * 0.75],
            [BLOCK / 4, m],
          ],
          medium,
        ),
      );
      break;
    }
  }
  return out.join('');
}

/** The SVG of one demo photo: the block on a cutting mat, lit from one side. */
export function demoBlockSvg(design: DemoDesign, seed: number): string {
  const rnd = random(seed);
  const pick = <T>(list: readonly T[]) => list[Math.floor(rnd() * list.length)]!;
  const dark = pick(darks);
  const medium = pick(mediums.filter((c) => c !== dark));
  const angle = (rnd() * 8 - 4).toFixed(2);
  const cx = WIDTH / 2 + (rnd() * 120 - 60);
  const cy = HEIGHT / 2 + (rnd() * 80 - 40);
  const grid: string[] = [];
  for (let x = 0; x <= WIDTH; x += PX_PER_INCH) {
    grid.push(
      `<line x1="${x}" y1="0" x2="${x}" y2="${HEIGHT}" stroke="#cfe3d6" stroke-opacity="${x % (PX_PER_INCH * 6) === 0 ? 0.55 : 0.25}" stroke-width="${x % (PX_PER_INCH * 6) === 0 ? 2.5 : 1.2}"/>`,
    );
  }
  for (let y = 0; y <= HEIGHT; y += PX_PER_INCH) {
    grid.push(
      `<line x1="0" y1="${y}" x2="${WIDTH}" y2="${y}" stroke="#cfe3d6" stroke-opacity="${y % (PX_PER_INCH * 6) === 0 ? 0.55 : 0.25}" stroke-width="${y % (PX_PER_INCH * 6) === 0 ? 2.5 : 1.2}"/>`,
    );
  }
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${WIDTH}" height="${HEIGHT}" viewBox="0 0 ${WIDTH} ${HEIGHT}">
  <defs>
    <linearGradient id="light" x1="0" y1="0" x2="1" y2="1">
      <stop offset="0" stop-color="#ffffff" stop-opacity="0.18"/><stop offset="1" stop-color="#000000" stop-opacity="0.22"/>
    </linearGradient>
  </defs>
  <rect width="${WIDTH}" height="${HEIGHT}" fill="#2f5447"/>
  ${grid.join('')}
  <g transform="translate(${cx} ${cy}) rotate(${angle}) translate(${-BLOCK / 2} ${-BLOCK / 2})">
    <rect x="6" y="8" width="${BLOCK + 4}" height="${BLOCK + 4}" rx="3" fill="#000000" fill-opacity="0.28"/>
    <rect x="3" y="4" width="${BLOCK + 2}" height="${BLOCK + 2}" rx="2" fill="#000000" fill-opacity="0.18"/>
    ${patches(design, dark, medium, palette.linen)}
  </g>
  <rect width="${WIDTH}" height="${HEIGHT}" fill="url(#light)"/>
</svg>`;
}

/** A JPEG photo of a demo block, as a phone would send it. */
export async function demoBlockPhoto(design: DemoDesign, seed: number): Promise<Buffer> {
  return sharp(Buffer.from(demoBlockSvg(design, seed)))
    .jpeg({ quality: 88 })
    .toBuffer();
}

/**
 * Stores one generated photo for each given block (made by its maker), through storePhotos. Call
 * it from the demo seed with blocks that are sewn or further along. Returns the number stored.
 */
export async function seedDemoPhotos(
  sequelize: Sequelize,
  config: PhotoStoreDeps['config'],
  blocks: readonly { id: number; guildId: number; makerId: number }[],
): Promise<number> {
  // The whole photo configuration goes on, so the demo's photos land in the configured folder or bucket.
  const deps = { sequelize, config };
  for (const block of blocks) {
    const design = demoDesigns[block.id % demoDesigns.length]!;
    await storePhotos(deps, {
      files: [{ originalname: `${design}-block-${block.id}.jpg`, buffer: await demoBlockPhoto(design, block.id) }],
      guildId: block.guildId,
      uploadedBy: block.makerId,
      owner: { blockId: block.id },
    });
  }
  return blocks.length;
}
