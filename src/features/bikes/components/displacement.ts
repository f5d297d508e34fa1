import { ccToCubicInches } from '@shared/displacement';
import { formatNumber } from '@shared/format';

/** "1,640 cm³" — whole cm³, as engine makers quote it. */
export const formatCc = (cc: number) => `${formatNumber(cc)} cm³`;
/** "100.1 in³" — one decimal, enough to tell 96.0 from 96.6 in³ apart. */
export const formatCubicInches = (cc: number) => `${formatNumber(ccToCubicInches(cc), { decimals: 1 })} in³`;
