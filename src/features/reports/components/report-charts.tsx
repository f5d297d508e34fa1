import type { DisplayUnits } from '@shared/units-display';
import type { ReportCurveView, ReportGainView, ReportRunView } from '../api/types';
import { ReportChart } from './report-chart';
import { ReportDiffChart } from './report-diff-chart';

/**
 * The report's two pictures side by side (stacked on a tablet): the absolute power and torque
 * curves, and the difference from the baseline at every rpm.
 */
export function ReportCharts({ runs, curves, gains, units, summary }: { runs: ReportRunView[]; curves: ReportCurveView[]; gains: ReportGainView[]; units: DisplayUnits; summary: string }) {
  const hasDiff = runs.some((r) => r.isBaseline) && gains.length > 0;
  return (
    <div className={hasDiff ? 'grid min-w-0 gap-6 xl:grid-cols-2' : undefined}>
      <figure className="m-0 min-w-0">
        <figcaption className="mb-1 text-base font-semibold text-ink">Power and torque</figcaption>
        <ReportChart runs={runs} curves={curves} units={units} summary={summary} height={340} />
      </figure>
      {hasDiff && (
        <figure className="m-0 min-w-0">
          <figcaption className="mb-1 text-base font-semibold text-ink">Difference from the baseline</figcaption>
          <ReportDiffChart runs={runs} curves={curves} gains={gains} units={units} height={340} />
          <p className="m-0 mt-1 text-center text-sm text-ink-muted">Above the line: more than the baseline; below: less.</p>
        </figure>
      )}
    </div>
  );
}
