/**
 * The words Blockpost shows for a block's verdict and for a block's state: each with its glyph, its
 * colour token (a colour name of the client's theme) and its place in order. The quilt engine, the API
 * types, the server's events and mail, and the client all take them from here.
 */

/** Verdicts in the order they are listed and counted: best first. */
export const VERDICTS = ['true', 'trim', 'short', 'skewed'] as const;
export type Verdict = (typeof VERDICTS)[number];

/** Colour tokens a verdict is drawn in; never the only signal (the word and glyph always go with it). */
export type VerdictColour = 'lichen' | 'weld' | 'madder' | 'plum';

/** How a verdict is shown to people: `label` in full, `brief` where room is short, a glyph, a colour token. */
export const VERDICT_LABELS: Readonly<Record<Verdict, { label: string; brief: string; glyph: string; colour: VerdictColour }>> = {
  true: { label: 'True to size', brief: 'true', glyph: '✓', colour: 'lichen' },
  trim: { label: 'Trim to size', brief: 'trim', glyph: '✂', colour: 'weld' },
  short: { label: 'Runs short', brief: 'short', glyph: '↓', colour: 'madder' },
  skewed: { label: 'Out of square', brief: 'out of square', glyph: '◇', colour: 'plum' },
};

/** A photo estimate never says more than likely: "likely runs short", or brief, "likely short". */
export const likelyVerdict = (verdict: Verdict, brief = false) =>
  `likely ${brief ? VERDICT_LABELS[verdict].brief : VERDICT_LABELS[verdict].label.toLowerCase()}`;

/** A block's states in the order a block passes through them. */
export const blockStates = ['pledged', 'sewn', 'handed_in', 'received', 'measured', 'returned'] as const;
export type BlockState = (typeof blockStates)[number];

export const blockStateLabels: Readonly<Record<BlockState, string>> = {
  pledged: 'Pledged',
  sewn: 'Sewn',
  handed_in: 'Handed in',
  received: 'Received',
  measured: 'Measured',
  returned: 'Returned',
};

/** Each state's place in `blockStates` (0 for pledged), for comparisons without searching the list. */
export const blockStateRank = Object.fromEntries(blockStates.map((s, i) => [s, i])) as Readonly<Record<BlockState, number>>;

/** True when a block in state `a` has not yet reached state `b`. */
export const isBlockStateBefore = (a: BlockState, b: BlockState) => blockStateRank[a] < blockStateRank[b];
