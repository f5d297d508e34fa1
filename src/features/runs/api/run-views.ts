import type { QueryKey } from '@tanstack/react-query';
import { bikeKeys, buildKeys, comparisonKeys, runKeys, sessionKeys, stageKeys } from '@/lib/query-keys';

/**
 * Every view that shows a bike's runs or what is derived from them: run lists and pages, session
 * pages (their runs), stages (run counts, reference run), the bike's gains by stage (timeline) and
 * the runs offered for a comparison, the build finder (stage gains), and bike lists (the Today page).
 * A mutation that adds, removes, re-tags or re-reads runs invalidates all of them; each mutation
 * file lists these and anything else it changes.
 */
export function runViews(): QueryKey[] {
  return [
    runKeys.all(),
    sessionKeys.all(),
    stageKeys.all(),
    comparisonKeys.timelines(),
    comparisonKeys.candidatesAll(),
    buildKeys.all(),
    bikeKeys.lists(),
  ];
}
