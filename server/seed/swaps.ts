/**
 * Demo swaps for the invented Kestrel Hollow guild: one open for sign-up, one collecting blocks
 * with every verdict on the table, and one complete with its return confirmed. Verdicts and the
 * return are worked out by the quilt math engine, as the app does.
 */
import type { Transaction } from 'sequelize';
import { checkBlock, planDistribution } from '@shared/quilt';
import { blockSizes, type BlockSpec } from '@shared/schemas/blocks';
import type { SwapState } from '@shared/schemas/swaps';
import { Block, Measurement, Signup, Swap, SwapTransition, type User } from '../db/models';

const DAY = 86_400_000;
/** Midnight UTC `d` days from today: early evening in the demo guild's zone, a plausible deadline. */
const daysFromNow = (d: number) => new Date(Math.floor(Date.now() / DAY) * DAY + Math.round(d * DAY));

interface SwapSeed {
  title: string;
  description: string;
  block: BlockSpec;
  colourRules: { role: string; note: string }[];
  quota: [number, number];
  signupCloses: number;
  due: number;
  mode?: 'return' | 'gift';
  giftRecipientName?: string;
  /** In cents (the demo guild pays in usd). */
  fees?: { entry?: number; postage?: number };
}

type People = Map<string, User>;

function person(people: People, email: string): User {
  const user = people.get(email);
  if (!user) throw new Error(`The demo has no ${email}`);
  return user;
}

async function createSwap(
  guildId: number,
  by: User,
  seed: SwapSeed,
  path: SwapState[],
  startedDaysAgo: number,
  transaction: Transaction,
) {
  const sizes = blockSizes(seed.block);
  const swap = await Swap.create(
    {
      guildId,
      title: seed.title,
      description: seed.description,
      blockSpec: seed.block,
      seam: sizes.seam,
      unfinishedWidth: sizes.unfinished.width,
      unfinishedHeight: sizes.unfinished.height,
      finishedWidth: sizes.finished.width,
      finishedHeight: sizes.finished.height,
      tolerance: 0.125,
      squareness: 0.25,
      colourRules: seed.colourRules,
      quotaMin: seed.quota[0],
      quotaMax: seed.quota[1],
      signupClosesAt: daysFromNow(seed.signupCloses),
      dueAt: daysFromNow(seed.due),
      mode: seed.mode ?? 'return',
      giftRecipientName: seed.giftRecipientName ?? null,
      entryFee: seed.fees?.entry ?? 0,
      postageFee: seed.fees?.postage ?? 0,
      state: path.at(-1)!,
      createdById: by.id,
    },
    { transaction },
  );
  // The history: created as a draft, then one move every few days.
  const step = path.length > 1 ? startedDaysAgo / path.length : 0;
  for (const [i, to] of path.entries()) {
    await SwapTransition.create(
      {
        swapId: swap.id,
        fromState: i === 0 ? null : path[i - 1]!,
        toState: to,
        byId: by.id,
        at: daysFromNow(-startedDaysAgo + i * step),
      },
      { transaction },
    );
  }
  return swap;
}

async function pledge(swap: Swap, maker: User, count: number, transaction: Transaction): Promise<Block[]> {
  await Signup.create({ swapId: swap.id, userId: maker.id, blocks: count }, { transaction });
  return Block.bulkCreate(
    Array.from({ length: count }, (_, i) => ({ swapId: swap.id, makerId: maker.id, sequence: i + 1 })),
    { transaction, returning: true },
  );
}

type Size = { width: number; height: number; diagonals?: [number, number] };

async function measure(
  swap: Swap,
  block: Block,
  by: User,
  size: Size,
  source: 'ruler' | 'maker',
  at: Date,
  transaction: Transaction,
) {
  const { verdict, deviations } = checkBlock({
    target: { width: swap.unfinishedWidth, height: swap.unfinishedHeight },
    tolerance: swap.tolerance,
    squareness: swap.squareness,
    measured: size,
  });
  await Measurement.create(
    {
      blockId: block.id,
      measuredById: by.id,
      source,
      width: size.width,
      height: size.height,
      diagonal1: size.diagonals?.[0] ?? null,
      diagonal2: size.diagonals?.[1] ?? null,
      verdict,
      deviationWidth: deviations.width,
      deviationHeight: deviations.height,
      deviationDiagonal: deviations.diagonal ?? null,
      createdAt: at,
    },
    { transaction },
  );
  if (source === 'ruler') await block.update({ state: 'measured', verdict, measuredAt: at }, { transaction });
  return verdict;
}

/** Moves a block along its life up to `state`, with plausible dates a few days apart. */
async function advance(
  block: Block,
  state: 'sewn' | 'handed_in' | 'received',
  by: User,
  daysAgo: number,
  transaction: Transaction,
  hand?: { how: 'in-person' | 'post'; note?: string },
) {
  const at = (d: number) => daysFromNow(-daysAgo + d);
  await block.update(
    {
      state,
      sewnAt: at(0),
      ...(state !== 'sewn' ? { handedInAt: at(2), handInHow: hand?.how ?? 'in-person', handInNote: hand?.note ?? null } : {}),
      ...(state === 'received' ? { receivedAt: at(3), receivedById: by.id } : {}),
    },
    { transaction },
  );
}

const NINE_PATCH: BlockSpec = {
  kind: 'grid',
  columns: [3.5, 3.5, 3.5],
  rows: [3.5, 3.5, 3.5],
  seam: 0.25,
  roles: [
    ['dark', 'light', 'dark'],
    ['light', 'dark', 'light'],
    ['dark', 'light', 'dark'],
  ],
};

async function openSwap(guildId: number, people: People, transaction: Transaction) {
  const june = person(people, 'june@demo.test');
  const swap = await createSwap(
    guildId,
    june,
    {
      title: 'Migrating Geese Border',
      description:
        'Flying geese for a shared border round. Aim them all the same way; the border is pieced at the spring sew day.',
      block: { kind: 'flying-geese', finished: { width: 6, height: 3 }, method: 'no-waste' },
      colourRules: [
        { role: 'goose', note: 'warm mid-tones: rust, ochre, brick' },
        { role: 'sky', note: 'pale background, solid or near-solid' },
      ],
      quota: [4, 12],
      signupCloses: 12,
      due: 48,
      fees: { entry: 500, postage: 400 },
    },
    ['draft', 'signup'],
    6,
    transaction,
  );
  await pledge(swap, person(people, 'rosa@demo.test'), 8, transaction);
  await pledge(swap, person(people, 'lou@demo.test'), 4, transaction);
}

async function collectingSwap(guildId: number, people: People, transaction: Transaction): Promise<Block[]> {
  const theo = person(people, 'coordinator@demo.test');
  const swap = await createSwap(
    guildId,
    theo,
    {
      title: 'Lantern Row Nine-Patch',
      description:
        'Simple nine-patches for two lap quilts for the library reading corner. Dark corners and centre, light in between.',
      block: NINE_PATCH,
      colourRules: [
        { role: 'dark', note: 'deep indigo to storm blue; small prints welcome' },
        { role: 'light', note: 'unbleached to pale oat; tone-on-tone is fine' },
      ],
      quota: [1, 4],
      signupCloses: -20,
      due: 5,
    },
    ['draft', 'signup', 'sewing', 'collecting'],
    40,
    transaction,
  );
  const b = async (email: string, n: number) => pledge(swap, person(people, email), n, transaction);
  const priya = await b('member@demo.test', 3);
  const walt = await b('walt@demo.test', 2);
  const rosa = await b('rosa@demo.test', 4);
  const kwame = await b('kwame@demo.test', 2);
  const hana = await b('hana@demo.test', 2);
  const lou = await b('lou@demo.test', 1);
  const ines = await b('ines@demo.test', 3);
  const bea = await b('bea@demo.test', 2);
  const june = await b('june@demo.test', 2);
  const recent = (d: number) => daysFromNow(-d);
  const ruler = (block: Block, size: Size, d: number) => measure(swap, block, theo, size, 'ruler', recent(d), transaction);
  const take = async (block: Block, d: number, hand?: { how: 'in-person' | 'post'; note?: string }) =>
    advance(block, 'received', theo, d, transaction, hand);

  // Priya: one true, one sewn, one still pledged; she measured her sewn block herself.
  await take(priya[0]!, 9);
  await ruler(priya[0]!, { width: 9.5, height: 9.5, diagonals: [13.4375, 13.4375] }, 5);
  await advance(priya[1]!, 'sewn', theo, 3, transaction);
  await measure(
    swap,
    priya[1]!,
    person(people, 'member@demo.test'),
    { width: 9.4375, height: 9.5 },
    'maker',
    recent(2),
    transaction,
  );
  // Walt: one runs short, re-measured (history kept); one handed in by post.
  await take(walt[0]!, 10);
  await ruler(walt[0]!, { width: 9.25, height: 9.375 }, 6);
  await ruler(walt[0]!, { width: 9.25, height: 9.3125 }, 5);
  await advance(walt[1]!, 'handed_in', theo, 4, transaction, { how: 'post', note: 'Posted second class, tracking KH 4471 0932' });
  // Rosa: three true, one trim (big, not trimmed yet).
  for (const [i, block] of rosa.entries()) {
    await take(block, 12 - i);
    await ruler(block, i === 3 ? { width: 9.875, height: 9.75 } : { width: 9.5, height: 9.5 + (i - 1) / 16 }, 7 - i);
  }
  // Kwame: one out of square, one received and waiting to be measured.
  await take(kwame[0]!, 8);
  await ruler(kwame[0]!, { width: 9.5, height: 9.5, diagonals: [13.25, 13.625] }, 4);
  await take(kwame[1]!, 2);
  // Hana: both true; Lou: sewn; Ines: one trim that was trimmed, two handed in; Bea: pledged; June: true + received.
  for (const block of hana) {
    await take(block, 11);
    await ruler(block, { width: 9.5625, height: 9.5 }, 6);
  }
  await advance(lou[0]!, 'sewn', theo, 6, transaction);
  await take(ines[0]!, 9);
  await ruler(ines[0]!, { width: 10, height: 9.875 }, 5);
  await ines[0]!.update({ trimmed: true, trimmedAt: recent(4) }, { transaction });
  await advance(ines[1]!, 'handed_in', theo, 3, transaction);
  await advance(ines[2]!, 'handed_in', theo, 3, transaction);
  await take(june[0]!, 7);
  await ruler(june[0]!, { width: 9.4375, height: 9.5625 }, 5);
  await take(june[1]!, 1);
  void bea;
  // Blocks sewn or further along get a demo photo.
  return [...priya.slice(0, 2), ...walt, ...rosa, ...kwame, ...hana, ...lou, ...ines, ...june];
}

/** The finished swap, its blocks returned to their new owners (who lay them out on the design wall); returns those blocks. */
async function completeSwap(guildId: number, people: People, transaction: Transaction): Promise<Block[]> {
  const dot = person(people, 'dot@demo.test');
  const swap = await createSwap(
    guildId,
    dot,
    {
      title: 'Cornerstone Squares',
      description: 'Square-in-a-square units from the winter swap, now set into everyone’s table runners.',
      block: { kind: 'square-in-square', finished: 6 },
      colourRules: [
        { role: 'centre', note: 'a bold print you love' },
        { role: 'corners', note: 'a calm solid that lets the centre sing' },
      ],
      quota: [2, 2],
      signupCloses: -110,
      due: -75,
    },
    ['draft', 'signup', 'sewing', 'collecting', 'sorting', 'complete'],
    130,
    transaction,
  );
  const makers = [
    'admin@demo.test',
    'coordinator@demo.test',
    'member@demo.test',
    'walt@demo.test',
    'hana@demo.test',
    'bea@demo.test',
  ];
  const sizes: Size[] = [
    { width: 6.5, height: 6.5 },
    { width: 6.5625, height: 6.5 },
    { width: 6.25, height: 6.5 },
  ];
  const accepted = new Map<number, Block[]>();
  for (const [i, email] of makers.entries()) {
    const blocks = await pledge(swap, person(people, email), 2, transaction);
    for (const [j, block] of blocks.entries()) {
      await advance(block, 'received', dot, 80, transaction);
      // Every fifth block runs short; the rest are true to size.
      const verdict = await measure(
        swap,
        block,
        dot,
        sizes[(i * 2 + j) % 5 === 4 ? 2 : j]!,
        'ruler',
        daysFromNow(-74),
        transaction,
      );
      if (verdict === 'true') accepted.set(block.makerId, [...(accepted.get(block.makerId) ?? []), block]);
    }
  }
  const plan = planDistribution([...accepted].map(([id, blocks]) => ({ id: String(id), accepted: blocks.length })));
  const returnedAt = daysFromNow(-60);
  const returned: Block[] = [];
  for (const t of plan.transfers) {
    for (const block of accepted.get(Number(t.from))!.splice(0, t.count)) {
      await block.update({ state: 'returned', recipientId: Number(t.to), returnedAt }, { transaction });
      returned.push(block);
    }
  }
  await swap.update({ distributionConfirmedAt: returnedAt, distributionConfirmedById: dot.id }, { transaction });
  return returned;
}

/** Seeds the three demo swaps; returns the blocks that should get a demo photo. */
export async function seedDemoSwaps(guildId: number, people: People, transaction: Transaction): Promise<Block[]> {
  // The returned blocks get photos too, so each member's design wall shows real tiles.
  const returned = await completeSwap(guildId, people, transaction);
  const photographed = await collectingSwap(guildId, people, transaction);
  await openSwap(guildId, people, transaction);
  return [...returned, ...photographed];
}
