/**
 * The build-plan quote the customer is sent: the gain report's look (its styles, sections, tables
 * and stat blocks, Barlow, the shop header), with the items, the total and deposit, the expected
 * gain worded as past results, the band chart and the cautions.
 */
import { createElement } from 'react';
import { Document, Page, Text, View, renderToBuffer } from '@react-pdf/renderer';
import { formatDate, formatMoney, formatNumber } from '@shared/format';
import { HEAD_WORK_LABELS, PART_CATEGORY_LABELS } from '@shared/parts';
import { palette } from '@shared/theme';
import type { PlanItemDto, PlanPredictionDto } from '@shared/schemas/plans';
import type { UnitSystem } from '../../shops/shop.entity';
import { fmtPowerGain } from '../../reports/figures';
import { Letterhead, PageFooter, ReportSection as Section, ReportStat as Stat, ReportTable as Table, reportStyles as s } from '../../reports/pdf/gain-report';
import { registerReportFonts } from '../../reports/pdf/fonts';
import { readImageHeader, withinImageLimits } from '../../../lib/image-guard';
import { BandChart } from './band-chart';

export interface PlanQuoteData {
  shop: { name: string; address: string | null; phone: string | null; email: string | null; units: UnitSystem; paperSize: 'letter' | 'a4'; timeZone: string };
  customerName: string;
  bikeLine: string;
  bikeDetails: string;
  title: string;
  note: string | null;
  version: number;
  sentAt: Date;
  validUntil: Date;
  items: PlanItemDto[];
  totalCostCents: number;
  depositCents: number;
  currency: string;
  prediction: PlanPredictionDto;
  url: string;
}

const tnum = ['tnum', 'lnum'] as const;

function PlanQuoteDocument({ d, logo }: { d: PlanQuoteData; logo: { data: Buffer; format: 'png' | 'jpg' } | null }) {
  const u = d.shop.units;
  const money = (c: number) => formatMoney(c, { minorUnits: true, currency: d.currency.toUpperCase() });
  const p = d.prediction;
  const width = (d.shop.paperSize === 'a4' ? 595.28 : 612) - 80;
  const date = formatDate(d.sentAt, { timeZone: d.shop.timeZone });
  const median = p.peakPowerGainHp?.median ?? p.estimate?.peakPowerGainHp ?? null;
  return (
    <Document title={`Build plan v${d.version} — ${d.bikeLine}`} author={d.shop.name} subject="Build plan quote" creator="Pullbook" producer="Pullbook" language="en">
      <Page size={d.shop.paperSize === 'a4' ? 'A4' : 'LETTER'} style={s.page} wrap>
        <PageFooter text={`${d.shop.name}  ·  Build plan v${d.version}  ·  ${date}`} />
        <Letterhead shop={d.shop} logo={logo} title="Build plan" lines={[`version ${d.version}`, `${date} · open until ${formatDate(d.validUntil, { timeZone: d.shop.timeZone })}`]} />
        <View style={s.accentRule} />
        <View style={s.twoCol}>
          <View style={s.col}>
            <Text style={s.label}>Prepared for</Text>
            <Text style={{ fontSize: 11, fontWeight: 500 }}>{d.customerName}</Text>
          </View>
          <View style={s.col}>
            <Text style={s.label}>Motorcycle</Text>
            <Text style={{ fontSize: 11, fontWeight: 500 }}>{d.bikeLine}</Text>
            <Text style={s.muted}>{d.bikeDetails}</Text>
          </View>
          <View style={s.col}>
            <Text style={s.label}>The work</Text>
            <Text style={{ fontSize: 11, fontWeight: 500 }}>{d.title}</Text>
          </View>
        </View>

        <View style={s.statRow}>
          <Stat label="Total" value={money(d.totalCostCents)} sub="parts and labour" />
          <Stat label="Deposit" value={d.depositCents ? money(d.depositCents) : 'None'} sub={d.depositCents ? 'due on acceptance' : 'no deposit asked'} />
          <Stat label={p.kind === 'estimate' ? 'Estimated gain' : 'Past median gain'} value={median !== null ? fmtPowerGain(median, u) : '—'} sub={p.peakPowerGainHp ? `middle half ${fmtPowerGain(p.peakPowerGainHp.q1, u)} to ${fmtPowerGain(p.peakPowerGainHp.q3, u)}` : `${p.count} similar build${p.count === 1 ? '' : 's'}`} />
          <Stat label="Cost per hp" value={p.costPerHpCents !== null ? money(p.costPerHpCents) : '—'} sub="total ÷ median peak gain" />
        </View>
        {d.note ? (
          <View style={[s.note, { marginTop: 10 }]}>
            <Text style={{ fontSize: 9.5, lineHeight: 1.45 }}>{d.note}</Text>
          </View>
        ) : null}

        <Section title="Parts and labour">
          <Table
            columns={[
              { title: 'Work', width: '60%' },
              { title: 'Parts', width: '13%', num: true },
              { title: 'Labour', width: '13%', num: true },
              { title: 'Line total', width: '14%', num: true },
            ]}
            rows={d.items.map((i) => [
              `${PART_CATEGORY_LABELS[i.category]}${i.headWork ? ` (${HEAD_WORK_LABELS[i.headWork]})` : ''}: ${i.description}`,
              money(i.partCostCents),
              money(i.labourCostCents),
              money(i.partCostCents + i.labourCostCents),
            ])}
          />
          <Text style={{ textAlign: 'right', marginTop: 5 }}>
            <Text style={s.muted}>Total </Text>
            <Text style={{ fontWeight: 600, fontFeatureSettings: [...tnum] }}>{money(d.totalCostCents)}</Text>
          </Text>
        </Section>

        <Section title="What this work added on similar builds">
          <Text style={s.summary}>{p.message}</Text>
          {p.peakPowerGainHp ? (
            <Text style={s.muted}>
              {`Peak power step on ${p.count} build${p.count === 1 ? '' : 's'}: lowest ${fmtPowerGain(p.peakPowerGainHp.min, u)}, middle half ${fmtPowerGain(p.peakPowerGainHp.q1, u)} to ${fmtPowerGain(p.peakPowerGainHp.q3, u)}, median ${fmtPowerGain(p.peakPowerGainHp.median, u)}, highest ${fmtPowerGain(p.peakPowerGainHp.max, u)}. Similar builds: ${p.criteria}.`}
            </Text>
          ) : null}
          {p.lowConfidence && p.kind !== 'none' ? <Text style={{ color: palette.warn.DEFAULT, marginTop: 3 }}>{`Low confidence: fewer than 5 similar builds.`}</Text> : null}
          {p.band ? (
            <View wrap={false} style={{ marginTop: 8 }}>
              <BandChart band={p.band} width={width} height={170} units={u} />
              <Text style={[s.subtle, { fontSize: 7.5, marginTop: 2, textAlign: 'center' }]}>
                {`Solid: ${p.band.baseLabel} (this bike today). Shaded: the middle half of the gains measured on similar builds at each rpm; dashed: their median (${formatNumber(Math.max(...p.band.builds))} builds at most).`}
              </Text>
            </View>
          ) : null}
          <Text style={[s.muted, { marginTop: 6, fontStyle: 'italic' }]}>{p.disclaimer}</Text>
        </Section>

        <View wrap={false} style={{ marginTop: 14 }}>
          <Text style={s.h2}>Reading this plan</Text>
          <Text style={s.caution}>The expected gain is what similar builds measured in this shop in the past, not a promise: every engine, tune and part batch differs. Dyno figures depend on the type of dyno, the correction standard and the conditions on the day.</Text>
          <Text style={s.caution}>Modifications may affect emissions compliance, noise limits, the maker's warranty and your insurance. Use on public roads is governed by local law; ask the shop which parts are approved where you ride. Leaner mixtures and more power raise engine temperatures: follow the engine maker's specifications and have work done by licensed technicians.</Text>
          <Text style={s.caution}>{`Review and accept online: ${d.url}`}</Text>
        </View>
      </Page>
    </Document>
  );
}

export async function renderPlanQuote(d: PlanQuoteData, logo?: Buffer | null): Promise<Buffer> {
  registerReportFonts();
  const header = logo ? readImageHeader(logo) : null;
  const logoProp = logo && header && withinImageLimits(header) ? { data: logo, format: header.format } : null;
  const element = createElement(PlanQuoteDocument, { d, logo: logoProp }) as unknown as Parameters<typeof renderToBuffer>[0];
  return renderToBuffer(element);
}
