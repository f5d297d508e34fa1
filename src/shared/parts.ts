/** Categories of work recorded on a stage. The build finder searches these. */
export const PART_CATEGORIES = [
  'exhaust',
  'intake',
  'fuel-tune',
  'camshaft',
  'cylinder-heads',
  'big-bore',
  'ignition',
  'drivetrain',
  'other',
] as const;
export type PartCategory = (typeof PART_CATEGORIES)[number];

export const PART_CATEGORY_LABELS: Record<PartCategory, string> = {
  exhaust: 'Exhaust',
  intake: 'Intake / air cleaner',
  'fuel-tune': 'Fuel / tune',
  camshaft: 'Camshaft',
  'cylinder-heads': 'Cylinder heads',
  'big-bore': 'Big bore / stroker',
  ignition: 'Ignition',
  drivetrain: 'Clutch / drivetrain',
  other: 'Other',
};

/** Cylinder-head work, in increasing order of extent (the order matters for "mild port or better"). */
export const HEAD_WORK_LEVELS = ['stock', 'mild-port', 'full-port', 'cnc', 'replacement'] as const;
export type HeadWorkLevel = (typeof HEAD_WORK_LEVELS)[number];

export const HEAD_WORK_LABELS: Record<HeadWorkLevel, string> = {
  stock: 'Stock',
  'mild-port': 'Clean-up / mild port',
  'full-port': 'Full port',
  cnc: 'CNC ported',
  replacement: 'Replacement heads',
};
