/**
 * A report version evaluates its comparison exactly once: the same figures are printed in the PDF
 * and stored as the version's summary. The comparison use case is passed in, so the test counts
 * the real evaluations (each call is the real one).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp, type TestShop } from '../support/test-app';
import { seedReportScenario } from '../support/report-fixtures';
import { toActor } from '@server/modules/auth/auth.service';
import { createReport } from '@server/modules/reports/create-report';
import { Report } from '@server/modules/reports/report.entity';
import { type EvaluateComparison, type EvaluateInput, evaluateComparison } from '@server/modules/comparisons/evaluate-comparison';
import type { ComparisonPreview } from '@shared/schemas/comparison';
import type { ReportData } from '@shared/schemas/report';

let t: TestApp;
let a: TestShop;
let scenario: Awaited<ReturnType<typeof seedReportScenario>>;

beforeAll(async () => {
  t = await createTestApp();
  a = await t.createShop('Evaluate Once Motors');
  scenario = await seedReportScenario(t, a);
});
afterAll(() => t.close());

function counting() {
  const calls: { input: EvaluateInput; preview: ComparisonPreview }[] = [];
  const attempts = { n: 0 };
  const evaluate: EvaluateComparison = async (em, actor, input) => {
    attempts.n += 1;
    const preview = await evaluateComparison(em, actor, input);
    calls.push({ input, preview });
    return preview;
  };
  return { calls, attempts, evaluate };
}

describe('report creation', () => {
  it('evaluates the comparison once and stores what it printed', async () => {
    const { calls, attempts, evaluate } = counting();
    const created = await createReport(t.deps, t.deps.orm.em.fork(), toActor(a.users.desk), { comparisonId: scenario.comparisonId }, evaluate);
    expect(attempts.n).toBe(1);
    expect(calls).toHaveLength(1);
    const [{ input, preview }] = calls;
    // The saved comparison's runs and options, in the shop's units (imperial → hp and lb·ft).
    expect(input.runIds).toEqual([scenario.runs.r0.id, scenario.runs.r1.id, scenario.runs.r2.id]);
    expect(input.baselineRunId).toBe(scenario.runs.r0.id);
    expect(input.options).toMatchObject({ correction: 'sae-j1349', units: 'hp-lbft' });
    expect(input.colorSlots && Object.keys(input.colorSlots).sort()).toEqual([scenario.runs.r0.id, scenario.runs.r1.id, scenario.runs.r2.id].sort());

    const stored = await t.deps.orm.em.fork().findOneOrFail(Report, created.id);
    const data = stored.summary as unknown as ReportData;
    expect(data.summary).toBe(preview.summary.join(' '));
    expect(data.gains.map((g) => g.peakPowerGain)).toEqual(preview.results.map((r) => r.peakPowerGain));
    expect(data.runs.map((r) => r.colorIndex)).toEqual(preview.runs.map((r) => r.colorIndex));
  });

  it('answers COMPARISON_NOT_COMPUTABLE, still after one evaluation, when a run is gone', async () => {
    const { calls, attempts, evaluate } = counting();
    const failing: EvaluateComparison = async (em, actor, input) => evaluate(em, actor, { ...input, runIds: [...input.runIds, '00000000-0000-4000-8000-000000000001'] });
    await expect(createReport(t.deps, t.deps.orm.em.fork(), toActor(a.users.desk), { comparisonId: scenario.comparisonId }, failing)).rejects.toMatchObject({
      code: 'COMPARISON_NOT_COMPUTABLE',
      status: 422,
      message: 'This comparison cannot be reported on: A run of this comparison was deleted or is not visible to you.',
    });
    expect(attempts.n).toBe(1);
    expect(calls).toHaveLength(0); // the one evaluation threw
  });
});
