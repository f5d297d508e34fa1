/**
 * What other modules use of the runs module: the run scope, the run DTOs and the bike label.
 * The use cases live one per file beside this one (upload-runs.ts, list-runs.ts, get-run.ts,
 * update-run.ts, delete-restore-run.ts, apply-mapping.ts, reprocess-run.ts, raw-file.ts…).
 */
import { bikeLabel } from '@shared/labels';

export { runScope, getRunEntity } from './run-scope';
export { RUN_POPULATE, referenceRunIds, runSummaryOf, toRunDetail, toRunSummaries, toRunSummary } from './run-dto';

/** @deprecated the one definition is `bikeLabel` in src/shared/labels.ts. */
export const bikeLabelOf = bikeLabel;
