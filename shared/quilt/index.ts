/** The quilt math engine: pure functions over lengths in inches (exact rationals inside). */
export { QuiltInputError } from './rational';
export {
  LengthParseError,
  MAX_LENGTH_TEXT,
  MM_PER_INCH,
  formatDeviation,
  formatLength,
  formatLengthExact,
  inchesToMm,
  mmToInches,
  parseLength,
  parseLengthExact,
} from './lengths';
export type { FormatOptions, ParseOptions } from './lengths';
export { DEFAULT_SEAM, finishedSize, gridBlock, stripSetWidth, unfinishedSize } from './blocks';
export type { GridBlock, GridPatch, GridSpec, Size } from './blocks';
export { gridCutList, gridRecipe, gridStripSets, packFirstFitDecreasing } from './grid-recipe';
export type { CutListRow, GridRecipe, RecipeOptions, StripSetDesign, StripToCut } from './grid-recipe';
export {
  HST_METHODS,
  HST_YIELDS,
  batchCuts,
  flyingGeeseCuts,
  hstCut,
  hstCutSize,
  hstUnits,
  qstCut,
  qstCutSize,
  settingTriangles,
  squareInSquareCuts,
} from './units';
export type { GeeseMethod, GeesePiece, HstMethod, SettingTriangles, SquareInSquareCuts, UnitCut } from './units';
export {
  DEFAULT_USABLE_WOF,
  FAT_EIGHTH_9X21,
  FAT_QUARTER_18X21,
  FAT_QUARTER_18X22,
  INCHES_PER_YARD,
  fatQuarterYield,
  fatQuartersNeeded,
  inchesToYards,
  piecesPerRectangle,
  precutSquaresNeeded,
  roundUpToEighthYard,
  squaresPerYard,
  stripPlan,
  stripsPerYard,
  yardsToInches,
} from './fabric';
export type { Piece, PrecutPlanRow, StripPlan, StripPlanOptions, StripPlanPiece, StripPlanRow } from './fabric';
export { chooseLayout, layoutForTarget, quiltPlan } from './quilt-plan';
export type { BackingLayout, QuiltPlan, QuiltPlanOptions, Rect } from './quilt-plan';
export { CRIB_INTERIOR_CPSC, MATTRESS_SIZES, quiltSizeForBed } from './mattress';
export type { MattressSize } from './mattress';
export { DEFAULT_SQUARENESS, VERDICTS, VERDICT_LABELS, checkBlock, diagonalOf } from './check-block';
export type { CheckBlockInput, CheckBlockResult, Verdict } from './check-block';
export { planDistribution } from './distribution';
export type { Angel, DistributionPlan, Maker, Transfer } from './distribution';
export { applyHomography, homography } from './homography';
export type { Homography, Point, Quad } from './homography';
export { QUALITY_LIMITS, measureFromPhoto, photoMeasureQuality } from './photo-measure';
export type { PhotoMeasurement, PhotoQuality, PhotoReference } from './photo-measure';
export {
  distributionInputSchema,
  gridSpecSchema,
  hstMethodSchema,
  lengthSchema,
  measurementSchema,
  photoMeasureSchema,
  positiveLengthSchema,
  quadSchema,
} from './schemas';
