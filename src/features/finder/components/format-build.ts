import { PART_CATEGORY_LABELS, HEAD_WORK_LABELS, type PartCategory, type HeadWorkLevel } from '@shared/parts';
import { ccToCubicInches } from '@shared/displacement';
import { formatNumber } from '@shared/format';

export const categoryLabel = (c: PartCategory) => PART_CATEGORY_LABELS[c] ?? c;
export const headLabel = (l: HeadWorkLevel) => HEAD_WORK_LABELS[l] ?? l;

/** "1,690 cm³ (103 in³)". */
export function formatDisplacement(cc: number | null): string {
  if (cc === null) return '—';
  return `${formatNumber(cc)} cm³ (${formatNumber(ccToCubicInches(cc))} in³)`;
}
