/**
 * The customer's gain report: one or two pages, Letter or A4, in the shop's units. Calm neutral
 * palette with the one warm accent; large tabular figures; the chart drawn as vectors.
 */
import { Document, Image, Page, StyleSheet, Text, View } from '@react-pdf/renderer';
import type { ReactNode } from 'react';
import { palette } from '@shared/theme';
import { formatDate, formatNumber, formatRpmRange } from '@shared/format';
import { PART_CATEGORY_LABELS, type PartCategory } from '@shared/parts';
import { correctionHeadline, costPerPower, fmtMoneyCents, fmtPctChange, fmtPower, fmtPowerGain, fmtRpm, fmtTorque, fmtTorqueGain, unitLabels } from '../figures';
import { headlineGain, type ReportData } from '../report-data';
import { costCoverage } from '@shared/schemas/report';
import { formatAirTemperature, formatBarometric } from '@shared/units-display';
import { LegendSwatch, OverlayChart } from './chart';
import { DifferenceChart } from './diff-chart';
import { PDF_FONT } from './fonts';

export interface ReportLogo {
  data: Buffer;
  format: 'png' | 'jpg';
}

const ink = palette.ink;
const tnum = ['tnum', 'lnum'] as const;

/** Barlow everywhere: every style names it, so no text falls back to (and embeds) Helvetica. */
function withFont<T extends Record<string, object>>(styles: T): T {
  return Object.fromEntries(Object.entries(styles).map(([k, v]) => [k, { fontFamily: PDF_FONT, ...v }])) as T;
}

const s = StyleSheet.create(withFont({
  page: { fontFamily: PDF_FONT, fontSize: 9, color: ink.DEFAULT, paddingTop: 36, paddingBottom: 48, paddingHorizontal: 40, backgroundColor: '#FFFFFF' },
  header: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'flex-start' },
  shopBlock: { flexDirection: 'row', alignItems: 'center', maxWidth: '60%' },
  logo: { maxHeight: 44, maxWidth: 110, marginRight: 12, objectFit: 'contain' },
  shopName: { fontSize: 14, fontWeight: 600, lineHeight: 1.25 },
  muted: { color: ink.muted },
  subtle: { color: ink.subtle },
  titleBlock: { alignItems: 'flex-end' },
  title: { fontSize: 20, fontWeight: 600, color: ink.DEFAULT, letterSpacing: 0.2, lineHeight: 1.2, marginBottom: 2 },
  accentRule: { height: 2, backgroundColor: palette.accent.DEFAULT, marginTop: 12, marginBottom: 12, width: 56 },
  rule: { height: 0.6, backgroundColor: palette.line.DEFAULT, marginVertical: 10 },
  twoCol: { flexDirection: 'row', gap: 24 },
  col: { flex: 1 },
  label: { fontSize: 7.5, fontWeight: 600, color: ink.subtle, textTransform: 'uppercase', letterSpacing: 0.8, marginBottom: 2 },
  h2: { fontSize: 11.5, fontWeight: 600, marginBottom: 6, marginTop: 4 },
  statRow: { flexDirection: 'row', gap: 8, marginTop: 4 },
  stat: { flex: 1, backgroundColor: palette.paper.DEFAULT, borderRadius: 4, paddingVertical: 8, paddingHorizontal: 10 },
  statValue: { fontSize: 21, fontWeight: 600, fontFeatureSettings: [...tnum], lineHeight: 1.15 },
  statSub: { fontSize: 8.5, color: ink.muted, fontFeatureSettings: [...tnum] },
  summary: { fontSize: 10.5, lineHeight: 1.45, marginTop: 10, marginBottom: 6 },
  legend: { flexDirection: 'row', flexWrap: 'wrap', gap: 14, marginTop: 4, justifyContent: 'center' },
  legendItem: { flexDirection: 'row', alignItems: 'center', gap: 5 },
  table: { borderTopWidth: 0.6, borderTopColor: palette.line.strong },
  tr: { flexDirection: 'row', borderBottomWidth: 0.5, borderBottomColor: palette.line.DEFAULT, paddingVertical: 3.5 },
  th: { fontSize: 7.5, fontWeight: 600, color: ink.subtle, textTransform: 'uppercase', letterSpacing: 0.5 },
  num: { textAlign: 'right', fontFeatureSettings: [...tnum] },
  note: { backgroundColor: palette.paper.DEFAULT, borderLeftWidth: 2, borderLeftColor: palette.accent.DEFAULT, padding: 8, marginTop: 4 },
  caution: { fontSize: 8, color: ink.muted, lineHeight: 1.4, marginBottom: 3 },
  footer: { position: 'absolute', bottom: 22, left: 40, right: 40, flexDirection: 'row', justifyContent: 'space-between', borderTopWidth: 0.5, borderTopColor: palette.line.DEFAULT, paddingTop: 5 },
  footerText: { fontSize: 7.5, color: ink.subtle },
  gainText: { color: palette.gain.DEFAULT },
  lossText: { color: palette.loss.DEFAULT },
}));

function Section({ title, children, wrap = false }: { title: string; children: ReactNode; wrap?: boolean }) {
  return (
    <View wrap={wrap} style={{ marginTop: 12 }}>
      <Text style={s.h2} minPresenceAhead={40}>
        {title}
      </Text>
      {children}
    </View>
  );
}

interface Column {
  title: string;
  width: number | string;
  num?: boolean;
}

function Table({ columns, rows }: { columns: Column[]; rows: (string | ReactNode)[][] }) {
  return (
    <View style={s.table}>
      <View style={s.tr} fixed={false}>
        {columns.map((c) => (
          <Text key={c.title} style={[s.th, { width: c.width }, c.num ? { textAlign: 'right', paddingLeft: 4 } : { paddingRight: 6 }]}>
            {c.title}
          </Text>
        ))}
      </View>
      {rows.map((row, i) => (
        <View key={i} style={s.tr} wrap={false}>
          {row.map((cell, j) => (
            <View key={j} style={{ width: columns[j].width, paddingRight: columns[j].num ? 0 : 6 }}>
              {typeof cell === 'string' ? <Text style={columns[j].num ? s.num : {}}>{cell}</Text> : cell}
            </View>
          ))}
        </View>
      ))}
    </View>
  );
}

/**
 * A run label that does not break badly: the run number stays with "run" ("Stage 3 — ported
 * heads · run 1" never ends a line with "run", "Baseline pull 1" never leaves "1" alone), via no-break spaces.
 */
export const runLabel = (label: string) => label.replace(/ · (\S+) (\d+)$/, '\u00a0·\u00a0$1\u00a0$2').replace(/ (\S+) (\d+)$/, ' $1\u00a0$2');

const signTone = (v: number) => (v > 0.05 ? s.gainText : v < -0.05 ? s.lossText : {});

function bikeLine(b: ReportData['bike']) {
  return [b.year, b.make, b.model].filter(Boolean).join(' ');
}

function Stat({ label, value, sub }: { label: string; value: string; sub?: string }) {
  return (
    <View style={s.stat}>
      <Text style={s.label}>{label}</Text>
      <Text style={s.statValue}>{value}</Text>
      {sub ? <Text style={s.statSub}>{sub}</Text> : null}
    </View>
  );
}

function BandBar({ value, max }: { value: number; max: number }) {
  const pct = max > 0 ? Math.min(1, Math.abs(value) / max) : 0;
  return (
    <View style={{ flexDirection: 'row', height: 7, alignItems: 'center' }}>
      <View style={{ width: '50%', flexDirection: 'row', justifyContent: 'flex-end' }}>
        {value < 0 ? <View style={{ width: `${pct * 100}%`, height: 7, backgroundColor: palette.paper.sunk, borderWidth: 0.6, borderColor: ink.subtle, borderStyle: 'dashed' }} /> : null}
      </View>
      <View style={{ width: 0.8, height: 9, backgroundColor: palette.line.strong }} />
      <View style={{ width: '50%' }}>{value > 0 ? <View style={{ width: `${pct * 100}%`, height: 7, backgroundColor: palette.gain.DEFAULT, opacity: 0.75 }} /> : null}</View>
    </View>
  );
}

/** The running footer every Pullbook PDF shares (gain report, build-plan quote). */
export function PageFooter({ text }: { text: string }) {
  return (
    <View style={s.footer} fixed>
      <Text style={s.footerText}>{text}</Text>
      <Text style={s.footerText} render={({ pageNumber, totalPages }) => `Page ${pageNumber} of ${totalPages}`} />
    </View>
  );
}

/** The letterhead every Pullbook PDF shares: the shop (logo, name, address, contact), the document's title and lines. */
export function Letterhead({ shop, logo, title, lines }: { shop: { name: string; address: string | null; phone: string | null; email: string | null }; logo?: ReportLogo | null; title: string; lines: string[] }) {
  return (
    <View style={s.header}>
      <View style={s.shopBlock}>
        {logo ? <Image style={s.logo} src={{ data: logo.data, format: logo.format }} /> : null}
        <View>
          <Text style={s.shopName}>{shop.name}</Text>
          {shop.address ? <Text style={s.muted}>{shop.address}</Text> : null}
          <Text style={s.muted}>{[shop.phone, shop.email].filter(Boolean).join('  ·  ')}</Text>
        </View>
      </View>
      <View style={s.titleBlock}>
        <Text style={s.title}>{title}</Text>
        {lines.map((line) => <Text key={line} style={[s.muted, { fontFeatureSettings: [...tnum] }]}>{line}</Text>)}
      </View>
    </View>
  );
}

export function GainReportDocument({ data, logo }: { data: ReportData; logo?: ReportLogo | null }) {
  const u = data.units;
  const labels = unitLabels(u);
  const head = headlineGain(data);
  const runById = new Map(data.runs.map((r) => [r.id, r]));
  const baseline = data.runs.find((r) => r.isBaseline) ?? data.runs[0];
  const finalRun = head ? runById.get(head.runId) : undefined;
  const size = data.paperSize === 'a4' ? 'A4' : 'LETTER';
  const contentWidth = (data.paperSize === 'a4' ? 595.28 : 612) - 80;
  const date = formatDate(data.createdAt, { timeZone: data.timeZone ?? 'UTC' });
  const perPower = data.cost ? costPerPower(data.cost.totalCostCents, data.cost.gainHp, u) : null;
  const corrected = correctionHeadline(data.runs);

  return (
    <Document title={`Gain report ${data.number} v${data.version} — ${bikeLine(data.bike)}`} author={data.shop.name} subject="Dyno gain report" creator="Pullbook" producer="Pullbook" language="en">
      <Page size={size} style={s.page} wrap>
        <PageFooter text={`${data.shop.name}  ·  Gain report ${data.number} v${data.version}  ·  ${date}`} />
        <Letterhead shop={data.shop} logo={logo} title="Gain report" lines={[`No. ${data.number}  ·  version ${data.version}`, date]} />
        <View style={s.accentRule} />

        <View style={s.twoCol}>
          <View style={s.col}>
            <Text style={s.label}>Prepared for</Text>
            <Text style={{ fontSize: 11, fontWeight: 500 }}>{data.customer.name}</Text>
          </View>
          <View style={s.col}>
            <Text style={s.label}>Motorcycle</Text>
            <Text style={{ fontSize: 11, fontWeight: 500 }}>{bikeLine(data.bike)}</Text>
            <Text style={s.muted}>
              {[data.bike.engineFamily, data.bike.displacementCc ? `${formatNumber(data.bike.displacementCc)} cm³` : null, data.bike.vin ? `VIN ${data.bike.vin}` : null].filter(Boolean).join('  ·  ')}
            </Text>
          </View>
          <View style={s.col}>
            <Text style={s.label}>Compared</Text>
            <Text style={{ fontSize: 11, fontWeight: 500 }}>{finalRun ? `${runLabel(finalRun.label)} against ${runLabel(baseline?.label ?? 'baseline')}` : data.comparison.name}</Text>
            <Text style={s.muted}>{corrected}</Text>
          </View>
        </View>

        {head ? (
          <View style={s.statRow}>
            <Stat label="Peak power" value={fmtPowerGain(head.peakPowerGain.hp, u)} sub={`${fmtPctChange(head.peakPowerGain.pct)}  ·  now ${finalRun ? fmtPower(finalRun.peakPower.hp, u) : ''}`} />
            <Stat label="Peak torque" value={fmtTorqueGain(head.peakTorqueGain.lbft, u)} sub={`${fmtPctChange(head.peakTorqueGain.pct)}  ·  now ${finalRun ? fmtTorque(finalRun.peakTorque.lbft, u) : ''}`} />
            <Stat label="Area under power" value={fmtPctChange(head.areaGainPct)} sub="over the shared rpm range" />
            <Stat label="Average gain" value={fmtPowerGain(head.averagePowerGainHp, u)} sub={perPower ? `${perPower} of peak gain` : 'across the shared rpm range'} />
          </View>
        ) : null}

        <Text style={s.summary}>{data.summary}</Text>

        <View wrap={false}>
          <View style={{ flexDirection: 'row', gap: 8 }}>
            <OverlayChart width={contentWidth * 0.58} height={250} runs={data.runs} curves={data.curves} units={u} />
            <DifferenceChart data={data} width={contentWidth * 0.42 - 8} height={250} />
          </View>
          <View style={s.legend}>
            {data.runs.map((r) => (
              <View key={r.id} style={s.legendItem}>
                <LegendSwatch colorIndex={r.colorIndex} />
                <Text style={{ fontSize: 8.5 }}>
                  {r.label}
                  {r.isBaseline ? ' (baseline)' : ''}
                </Text>
              </View>
            ))}
            <Text style={[s.subtle, { fontSize: 8 }]}>{`power ${labels.power} solid · torque ${labels.torque} dashed`}</Text>
          </View>
        </View>

        <Section title="Gain figures">
          <Table
            columns={[
              { title: 'Run', width: '27%' },
              { title: 'Peak power', width: '12.5%', num: true },
              { title: 'Power change', width: '13%', num: true },
              { title: 'Peak torque', width: '12.5%', num: true },
              { title: 'Torque change', width: '13.5%', num: true },
              { title: 'Area', width: '9%', num: true },
              { title: 'Average', width: '12.5%', num: true },
            ]}
            rows={data.runs.map((r) => {
              const g = data.gains.find((x) => x.runId === r.id);
              return [
                <View key="n" style={{ flexDirection: 'row', alignItems: 'center', gap: 4 }}>
                  <LegendSwatch colorIndex={r.colorIndex} />
                  <Text style={{ flex: 1 }}>{r.isBaseline ? `${runLabel(r.label)} (baseline)` : runLabel(r.label)}</Text>
                </View>,
                `${fmtPower(r.peakPower.hp, u)}`,
                g ? <Text style={[s.num, signTone(g.peakPowerGain.hp)]}>{`${fmtPowerGain(g.peakPowerGain.hp, u)}`}</Text> : '—',
                `${fmtTorque(r.peakTorque.lbft, u)}`,
                g ? <Text style={[s.num, signTone(g.peakTorqueGain.lbft)]}>{`${fmtTorqueGain(g.peakTorqueGain.lbft, u)}`}</Text> : '—',
                g ? fmtPctChange(g.areaGainPct) : '—',
                g ? fmtPowerGain(g.averagePowerGainHp, u) : '—',
              ];
            })}
          />
          <Text style={[s.subtle, { fontSize: 7.5, marginTop: 3 }]}>
            {`Peak rpm: ${data.runs.map((r) => `${r.label} power at ${fmtRpm(r.peakPower.rpm)}, torque at ${fmtRpm(r.peakTorque.rpm)}`).join('; ')}.`}
          </Text>
        </Section>

        {head ? (
          <Section title={`Where the power changed${data.gains.length > 1 && finalRun ? ` (${finalRun.label})` : ''}`}>
            <View style={s.twoCol}>
              <View style={{ flex: 3 }}>
                <Table
                  columns={[
                    { title: 'Engine speed', width: '34%' },
                    { title: 'Average change', width: '26%', num: true },
                    { title: '', width: '40%' },
                  ]}
                  rows={head.bands.map((b) => {
                    const max = Math.max(...head.bands.map((x) => Math.abs(x.averagePowerGainHp)), 0.1);
                    return [formatRpmRange(b.from, b.to), <Text style={[s.num, signTone(b.averagePowerGainHp)]}>{fmtPowerGain(b.averagePowerGainHp, u)}</Text>, <View style={{ paddingLeft: 10, paddingTop: 1.5 }}><BandBar value={b.averagePowerGainHp} max={max} /></View>];
                  })}
                />
              </View>
              <View style={{ flex: 2 }}>
                <Text style={s.label}>Largest gain</Text>
                <Text style={{ fontSize: 13, fontWeight: 600, fontFeatureSettings: [...tnum] }}>{`${fmtPowerGain(head.largestGain.hp, u)} at ${fmtRpm(head.largestGain.rpm)}`}</Text>
                <Text style={[s.label, { marginTop: 8 }]}>Largest loss</Text>
                <Text style={{ fontSize: 13, fontWeight: 600, fontFeatureSettings: [...tnum] }}>
                  {head.largestLoss.hp < 0 ? `${fmtPowerGain(head.largestLoss.hp, u)} at ${fmtRpm(head.largestLoss.rpm)}` : 'None: no loss anywhere in the shared range'}
                </Text>
                <Text style={[s.subtle, { fontSize: 7.5, marginTop: 6 }]}>Bars: gains to the right (solid), losses to the left (dashed outline).</Text>
              </View>
            </View>
          </Section>
        ) : null}

        <Section title="Build stages and cost">
          <Table
            columns={[
              { title: 'Stage', width: '22%' },
              { title: 'Work', width: '48%' },
              { title: 'Parts', width: '15%', num: true },
              { title: 'Labour', width: '15%', num: true },
            ]}
            rows={data.stages.flatMap((st) =>
              st.parts.length
                ? st.parts.map((p, i) => [
                    i === 0 ? <Text style={{ fontWeight: 500 }}>{`${st.name}${st.date ? `  ·  ${formatDate(st.date)}` : ''}`}</Text> : '',
                    `${PART_CATEGORY_LABELS[p.category as PartCategory] ?? p.category}: ${p.description}`,
                    fmtMoneyCents(p.partCostCents),
                    fmtMoneyCents(p.labourCostCents),
                  ])
                : [[<Text style={{ fontWeight: 500 }}>{st.name}</Text>, st.isBaseline ? 'As delivered (baseline)' : 'No parts recorded', '—', '—']],
            )}
          />
          {data.cost ? (
            <View style={{ marginTop: 5 }}>
              <View style={{ flexDirection: 'row', justifyContent: 'flex-end', gap: 18 }}>
                <Text>
                  <Text style={s.muted}>Cost of the work counted </Text>
                  <Text style={{ fontWeight: 600, fontFeatureSettings: [...tnum] }}>{fmtMoneyCents(data.cost.totalCostCents)}</Text>
                </Text>
                <Text>
                  <Text style={s.muted}>{`Cost per ${labels.power} of peak gain `}</Text>
                  <Text style={{ fontWeight: 600, fontFeatureSettings: [...tnum] }}>{perPower ? perPower.replace(/ per .*/, '') : 'not meaningful (no peak gain)'}</Text>
                </Text>
              </View>
              <Text style={[s.subtle, { fontSize: 7.5, marginTop: 2, textAlign: 'right' }]}>
                {`Counts ${costCoverage(data.cost)}, against the peak power gain of ${fmtPowerGain(data.cost.gainHp, u)}${finalRun ? ` (${finalRun.label} against ${baseline?.label ?? 'the baseline'})` : ''}.`}
              </Text>
            </View>
          ) : null}
        </Section>

        <Section title="Conditions and correction">
          <Table
            columns={[
              { title: 'Run', width: '27%' },
              { title: 'Recorded', width: '12%' },
              { title: 'Dyno', width: '16%' },
              { title: 'Air temp.', width: '9%', num: true },
              { title: 'Pressure', width: '10%', num: true },
              { title: 'Humidity', width: '9%', num: true },
              { title: 'Standard · factor', width: '17%', num: true },
            ]}
            rows={data.runs.map((r) => [
              // The run's name with its file under it, so the printed pull matches its file.
              <View key="n">
                <Text>{runLabel(r.label)}</Text>
                {r.fileName ? <Text style={[s.subtle, { fontSize: 7.5 }]}>{r.fileName}</Text> : null}
              </View>,
              r.recordedAt ? formatDate(r.recordedAt, { timeZone: data.timeZone ?? 'UTC' }) : '—',
              [r.dynoName, r.dynoKind].filter(Boolean).join(', ') || '—',
              formatAirTemperature(r.conditions.temperatureC, u, '—'),
              formatBarometric(r.conditions.baroKpa, u, '—'),
              r.conditions.humidityPct !== null ? `${formatNumber(r.conditions.humidityPct)}%` : '—',
              `${r.correctionLabel}${r.correctionFactor !== null ? ` · ${formatNumber(r.correctionFactor, { decimals: 3 })}` : ''}`,
            ])}
          />
          {data.repeatability ? <Text style={[s.muted, { marginTop: 5 }]}>{data.repeatability.text}</Text> : null}
          {data.warnings.map((w) => (
            <Text key={w} style={{ color: palette.warn.DEFAULT, marginTop: 3 }}>
              {`Note: ${w}`}
            </Text>
          ))}
        </Section>

        {data.technicianNote ? (
          <Section title="From the technician">
            <View style={s.note}>
              <Text style={{ fontSize: 9.5, lineHeight: 1.45 }}>{data.technicianNote}</Text>
            </View>
          </Section>
        ) : null}

        <View wrap={false} style={{ marginTop: 14 }}>
          <Text style={s.h2}>Reading these figures</Text>
          <Text style={s.caution}>
            Dyno figures depend on the type of dyno, the correction standard and the conditions on the day. Compare only like with like: the same dyno, the same correction standard, similar conditions. Figures from another shop or another dyno are not directly comparable with these.
          </Text>
          <Text style={s.caution}>
            {`Motorcycle engine test practice is covered by ISO 4106. ${corrected}; each run's conditions and correction factor are shown above.`}
          </Text>
          <Text style={s.caution}>
            Modifications may affect emissions compliance, noise limits, the maker's warranty and your insurance. Use on public roads is governed by local law; ask the shop which parts are approved where you ride. Leaner mixtures and more power raise engine temperatures: follow the engine maker's specifications and have work done by licensed technicians.
          </Text>
        </View>

      </Page>
    </Document>
  );
}

/** The report's look, for other customer documents (the build-plan quote): styles and building blocks. */
export { s as reportStyles, Section as ReportSection, Table as ReportTable, Stat as ReportStat };
