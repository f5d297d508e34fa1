import { useCallback, useMemo, useRef, useState } from 'react';
import type { ComparisonPreview, ComparisonResult, ComparisonWarning } from '@shared/schemas/comparison';
import { Badge, Button, Card, Caution, SelectField, Stat, cn, useToast, SimpleTable } from '@/components/ui';
import { correctionLabel } from '@shared/labels-display';
import { runColor } from '@/lib/chart-theme';
import { formatNumber, formatRpm, formatRpmRange } from '@shared/format';
import { type ChartHandle, DifferenceChart, OverlayChart, chartPng, chartSvg } from './comparison-charts';
import { curvesCsv, download, fileSlug } from '../lib/display';
import { displayUnits } from '@shared/units-display';
import { formatAirTemperature, formatBarometric } from '@shared/units-display';
import { useShopUnits } from '@/lib/shop-query';

const signed = (v: number, d = 1) => formatNumber(v, { decimals: d, signed: true });

/** Everything a comparison shows, from one preview: charts, figures, bands, sentences, warnings, spread. */
export function ComparisonView({ preview, name }: { preview: ComparisonPreview; name: string }) {
  const units = useMemo(() => displayUnits(preview.options.units), [preview.options.units]);
  const [diffRun, setDiffRun] = useState(preview.results[0]?.runId ?? '');
  const diffRunId = preview.results.some((r) => r.runId === diffRun) ? diffRun : (preview.results[0]?.runId ?? '');
  const overlay = useRef<ChartHandle | null>(null);
  const difference = useRef<ChartHandle | null>(null);
  const onOverlay = useCallback((h: ChartHandle) => (overlay.current = h), []);
  const onDifference = useCallback((h: ChartHandle) => (difference.current = h), []);
  const toast = useToast();
  const slug = fileSlug(name);
  const nameOf = (id: string) => preview.runs.find((r) => r.runId === id)?.name ?? 'Run';
  const colourOf = (id: string) => {
    const i = Math.max(0, preview.runs.findIndex((r) => r.runId === id));
    return runColor(preview.runs[i]?.colorIndex ?? i);
  };

  const exportChart = (which: 'overlay' | 'difference', type: 'png' | 'svg') => {
    const h = (which === 'overlay' ? overlay : difference).current;
    if (!h) return toast.error('The chart is not ready yet');
    if (type === 'png') {
      const url = chartPng(h);
      if (url) download(url, `${slug}-${which}.png`);
    } else download(new Blob([chartSvg(h)], { type: 'image/svg+xml' }), `${slug}-${which}.svg`);
  };

  return (
    <div className="space-y-6">
      <section aria-labelledby="cmp-summary" className="rounded-card border border-line bg-paper-raised p-4 shadow-card md:p-5">
        <h2 id="cmp-summary" className="text-lg font-semibold">
          What changed
        </h2>
        <ul className="mt-2 space-y-1 text-lg" data-testid="comparison-summary">
          {preview.summary.map((s, i) => (
            <li key={i}>{s}</li>
          ))}
        </ul>
        <p className="mt-2 text-sm text-ink-muted">
          Baseline: <strong className="text-ink">{preview.baseline.name}</strong> ({preview.baseline.bikeLabel}). Correction:{' '}
          {preview.options.correction ? labelOf(preview.options.correction) : 'each run’s own'}; bands of {formatNumber(preview.options.bandWidthRpm)} rpm
          {preview.options.rpmRange ? `; range ${formatRpmRange(preview.options.rpmRange[0], preview.options.rpmRange[1])}` : ''}.
        </p>
      </section>

      <Warnings warnings={preview.warnings} />

      <Card
        title="Power and torque"
        description="Every run on one chart, corrected as listed below."
        actions={
          <div className="flex flex-wrap gap-2">
            <Button size="sm" onClick={() => exportChart('overlay', 'png')}>
              PNG
            </Button>
            <Button size="sm" onClick={() => exportChart('overlay', 'svg')}>
              SVG
            </Button>
            <Button size="sm" onClick={() => download(new Blob([curvesCsv(preview, units)], { type: 'text/csv' }), `${slug}-curves.csv`)}>
              Curves CSV
            </Button>
          </div>
        }
      >
        <div data-testid="overlay-chart">
          <OverlayChart preview={preview} units={units} onReady={onOverlay} />
        </div>
      </Card>

      {preview.results.length > 0 && (
        <Card
          title="Difference from the baseline"
          description="Above the zero line is a gain (shaded); below it a loss (hatched)."
          actions={
            <div className="flex flex-wrap items-end gap-2">
              {preview.results.length > 1 && (
                <SelectField
                  label="Run"
                  hideLabel
                  value={diffRunId}
                  onChange={(e) => setDiffRun(e.target.value)}
                  options={preview.results.map((r) => ({ value: r.runId, label: nameOf(r.runId) }))}
                  containerClassName="min-w-48"
                />
              )}
              <Button size="sm" onClick={() => exportChart('difference', 'png')}>
                PNG
              </Button>
              <Button size="sm" onClick={() => exportChart('difference', 'svg')}>
                SVG
              </Button>
            </div>
          }
        >
          <DifferenceChart preview={preview} runId={diffRunId} units={units} onReady={onDifference} />
        </Card>
      )}

      {preview.results.slice(0, 2).map((r) => (
        <ResultCard key={r.runId} result={r} name={nameOf(r.runId)} colour={colourOf(r.runId)} baselineName={preview.baseline.name} units={units} />
      ))}
      {preview.results.length > 2 && (
        <details className="rounded-card border border-line bg-paper-raised">
          <summary className="focus-ring cursor-pointer rounded-card px-4 py-3 font-semibold">Figures of the other {preview.results.length - 2} runs</summary>
          <div className="space-y-6 p-4">
            {preview.results.slice(2).map((r) => (
              <ResultCard key={r.runId} result={r} name={nameOf(r.runId)} colour={colourOf(r.runId)} baselineName={preview.baseline.name} units={units} />
            ))}
          </div>
        </details>
      )}

      <RunsTable preview={preview} units={units} />
      <RepeatabilityTable preview={preview} />

      <Caution title="Compare like with like" kind="notice">
        Dyno figures depend on the dyno, the correction standard and the day’s air. Modifications may affect emissions compliance, noise limits, warranty and insurance; on-road use is governed by local law.
      </Caution>
    </div>
  );
}

const labelOf = (id: string) => correctionLabel(id, 'uncorrected');

function Warnings({ warnings }: { warnings: ComparisonWarning[] }) {
  if (!warnings.length) return null;
  return (
    <Caution title={warnings.length === 1 ? 'Before you trust these figures' : `Before you trust these figures (${warnings.length})`}>
      <ul className="list-disc space-y-1 pl-5" data-testid="comparison-warnings">
        {warnings.map((w, i) => (
          <li key={i} data-code={w.code}>
            {w.message}
          </li>
        ))}
      </ul>
    </Caution>
  );
}

function WithinBadge({ within }: { within: boolean | null }) {
  if (within === null) return null;
  return within ? (
    <Badge tone="neutral">within repeatability</Badge>
  ) : (
    <Badge tone="gain">beyond run-to-run spread</Badge>
  );
}

function ResultCard({ result: r, name, colour, baselineName, units }: { result: ComparisonResult; name: string; colour: string; baselineName: string; units: ReturnType<typeof displayUnits> }) {
  return (
    <Card
      title={
        <span className="inline-flex items-center gap-2">
          <span aria-hidden="true" className="inline-block h-3 w-3 rounded-sm" style={{ background: colour }} />
          {name} <span className="font-normal text-ink-muted">against {baselineName}</span>
        </span>
      }
      description={`Common range ${formatRpmRange(r.commonRpm[0], r.commonRpm[1])}`}
    >
      <div className="grid grid-cols-2 gap-4 md:grid-cols-3 xl:grid-cols-6">
        <div>
          <Stat label="Peak power" value={signed(units.p(r.peakPowerGain.hp))} unit={units.power} detail={`${signed(r.peakPowerGain.pct)} % · peak moved ${signed(r.peakPowerRpmShift, 0)} rpm`} />
          <WithinBadge within={r.withinRepeatability.peakPower} />
        </div>
        <div>
          <Stat label="Peak torque" value={signed(units.t(r.peakTorqueGain.lbft))} unit={units.torque} detail={`${signed(r.peakTorqueGain.pct)} % · peak moved ${signed(r.peakTorqueRpmShift, 0)} rpm`} />
          <WithinBadge within={r.withinRepeatability.peakTorque} />
        </div>
        <div>
          <Stat label="Average across the range" value={signed(units.p(r.averagePowerGainHp))} unit={units.power} detail={`torque ${signed(units.t(r.averageTorqueGainLbft))} ${units.torque}`} />
          <WithinBadge within={r.withinRepeatability.averagePower} />
        </div>
        <Stat label="Area under the power curve" value={signed(r.areaGainPct)} unit="%" />
        <Stat label="Largest gain" value={signed(units.p(r.largestGain.hp))} unit={units.power} detail={`at ${formatRpm(r.largestGain.rpm)}`} />
        <Stat label="Largest loss" value={r.largestLoss.hp < 0 ? signed(units.p(r.largestLoss.hp)) : 'none'} unit={r.largestLoss.hp < 0 ? units.power : undefined} detail={r.largestLoss.hp < 0 ? `at ${formatRpm(r.largestLoss.rpm)}` : 'no loss anywhere in the range'} />
      </div>
      <ul className="mt-4 space-y-1 text-ink">
        {r.sentences.map((s, i) => (
          <li key={i}>{s}</li>
        ))}
      </ul>
      <SimpleTable columns={['rpm band', { label: <>Δ power ({units.power})</>, numeric: true }, { label: <>Δ torque ({units.torque})</>, numeric: true }, { label: 'Run-to-run spread', numeric: true }, 'Reading']} caption={<>Average gain per rpm band, {name} against {baselineName}</>} className="mt-4 overflow-x-auto" minWidth="min-w-[32rem]">
        {r.bands.map((b) => (
          <tr key={b.from} className="border-t border-line">
            <th scope="row" className="px-3 py-2 text-left font-medium">{formatRpmRange(b.from, b.to)}</th>
            <td className={cn('px-3 py-2 text-right', b.averagePowerGainHp < 0 && 'text-loss')}>{signed(units.p(b.averagePowerGainHp))}</td>
            <td className={cn('px-3 py-2 text-right', b.averageTorqueGainLbft < 0 && 'text-loss')}>{signed(units.t(b.averageTorqueGainLbft))}</td>
            <td className="px-3 py-2 text-right">{b.spreadHp === null ? '—' : `±${formatNumber(units.p(b.spreadHp), { decimals: 1 })}`}</td>
            <td className="px-3 py-2">{b.withinRepeatability === null ? 'spread unknown' : b.withinRepeatability ? 'within repeatability' : b.averagePowerGainHp >= 0 ? 'gain' : 'loss'}</td>
          </tr>
        ))}
      </SimpleTable>
    </Card>
  );
}

function RunsTable({ preview, units }: { preview: ComparisonPreview; units: ReturnType<typeof displayUnits> }) {
  // Air conditions in the shop's units, as on the run and session pages.
  const airUnits = useShopUnits();
  return (
    <Card title="Runs in this comparison" flush>
      <SimpleTable columns={['Run', { label: 'Peak power', numeric: true }, { label: 'Peak torque', numeric: true }, 'Correction', 'Air', 'Dyno']} caption="Runs in this comparison" className="overflow-x-auto" minWidth="min-w-[40rem]">
        {preview.runs.map((r, i) => (
          <tr key={r.runId} className="border-t border-line">
            <th scope="row" className="px-3 py-2 text-left font-medium">
              <span className="inline-flex items-center gap-2">
                <span aria-hidden="true" className="inline-block h-3 w-3 rounded-sm" style={{ background: runColor(r.colorIndex ?? i) }} />
                {r.name}
                {r.runId === preview.baseline.runId && <Badge tone="neutral">baseline</Badge>}
              </span>
              <span className="block text-xs font-normal text-ink-muted [overflow-wrap:anywhere]">{r.fileName ? `${r.fileName} · ${r.bikeLabel}` : r.bikeLabel}</span>
            </th>
            <td className="px-3 py-2 text-right">
              {formatNumber(units.p(r.peakPower.hp), { decimals: 1 })} {units.power} <span className="text-ink-muted">@ {formatNumber(r.peakPower.rpm)}</span>
            </td>
            <td className="px-3 py-2 text-right">
              {formatNumber(units.t(r.peakTorque.lbft), { decimals: 1 })} {units.torque} <span className="text-ink-muted">@ {formatNumber(r.peakTorque.rpm)}</span>
            </td>
            <td className="px-3 py-2">
              {labelOf(r.correction.standard)} × {r.correction.factor.toFixed(3)}
              {r.correction.source === 'fallback' && <span className="block text-xs text-warn">stored factor kept (conditions missing)</span>}
            </td>
            <td className="px-3 py-2">
              {formatAirTemperature(r.conditions.temperatureC, airUnits, '—')} · {formatBarometric(r.conditions.baroKpa, airUnits, '—')}
            </td>
            <td className="px-3 py-2">{r.dynoName ?? '—'}</td>
          </tr>
        ))}
      </SimpleTable>
    </Card>
  );
}

function RepeatabilityTable({ preview }: { preview: ComparisonPreview }) {
  return (
    <Card title="Run-to-run spread" description="Stages with two or more ready runs. A gain smaller than the spread is marked “within repeatability”." flush>
      {preview.repeatability.length === 0 ? (
        <p className="px-4 py-3 text-ink-muted md:px-5">No stage here has two or more runs yet, so the spread is unknown. Make a second pull of each stage to know what is real.</p>
      ) : (
        <SimpleTable columns={['Stage', { label: 'Runs', numeric: true }, { label: 'Peak power spread', numeric: true }, { label: 'Peak torque spread', numeric: true }, { label: 'Largest deviation', numeric: true }]} caption="Run-to-run spread of each stage" className="overflow-x-auto" minWidth="min-w-[32rem]">
          {preview.repeatability.map((s) => (
            <tr key={s.stageId} className="border-t border-line">
              <th scope="row" className="px-3 py-2 text-left font-medium">{s.stageName}</th>
              <td className="px-3 py-2 text-right">{s.runs}</td>
              <td className="px-3 py-2 text-right">{formatNumber(s.peakPowerSpreadHp, { decimals: 1 })} hp</td>
              <td className="px-3 py-2 text-right">{formatNumber(s.peakTorqueSpreadLbft, { decimals: 1 })} lb·ft</td>
              <td className="px-3 py-2 text-right">
                {formatNumber(s.largestDeviationHp, { decimals: 1 })} hp at {formatRpm(s.largestDeviationRpm)}
              </td>
            </tr>
          ))}
        </SimpleTable>
      )}
    </Card>
  );
}
