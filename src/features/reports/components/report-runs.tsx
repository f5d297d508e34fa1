import type { PublicShareRun } from '@shared/schemas/report';
import { Card, SimpleTable } from '@/components/ui';
import { formatRpm } from '@shared/format';
import { powerValue, torqueValue, type displayUnits } from '@shared/units-display';
import { runColor } from '@/lib/chart-theme';

/**
 * The report's runs by their one name, with the file each came from, so pulls match their files.
 * Shown on the staff report page and on the customer's shared page alike.
 */
export function ReportRunsCard({ runs, units }: { runs: PublicShareRun[]; units: ReturnType<typeof displayUnits> }) {
  return (
    <Card title="Runs in this report" flush>
      <SimpleTable columns={['Run', { label: 'Peak power', numeric: true }, { label: 'Peak torque', numeric: true }, 'Correction']} caption="Runs in this report" className="overflow-x-auto" minWidth="min-w-[32rem]">
        {runs.map((r) => (
          <tr key={r.id} className="border-t border-line">
            <th scope="row" className="px-3 py-2 text-left font-medium">
              <span className="inline-flex items-center gap-2">
                <span aria-hidden="true" className="inline-block h-3 w-3 rounded-sm" style={{ background: runColor(r.colorIndex) }} />
                {r.label}
                {r.isBaseline ? ' (baseline)' : ''}
              </span>
              {r.fileName && <span className="block text-xs font-normal text-ink-muted [overflow-wrap:anywhere]">{r.fileName}</span>}
            </th>
            <td className="num px-3 py-2 text-right">
              {powerValue(units, r.peakPower.hp)} <span className="text-ink-subtle">at {formatRpm(r.peakPower.rpm)}</span>
            </td>
            <td className="num px-3 py-2 text-right">
              {torqueValue(units, r.peakTorque.lbft)} <span className="text-ink-subtle">at {formatRpm(r.peakTorque.rpm)}</span>
            </td>
            <td className="px-3 py-2">{r.correctionLabel}</td>
          </tr>
        ))}
      </SimpleTable>
    </Card>
  );
}
