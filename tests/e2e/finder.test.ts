import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBrowserHarness, type BrowserHarness } from '../support/browser';
import type { TestShop } from '../support/test-app';

/** Browser: the owner searches past builds by engine family and opens a result's bike page. */
let h: BrowserHarness;
let s: TestShop;

beforeAll(async () => {
  h = await startBrowserHarness();
  s = await h.t.createShop('Finder Browser Shop');
  const conn = h.t.deps.orm.em.fork().getConnection();
  // Two measured stages on the shop's bike (invented engine family), parts on each.
  await conn.execute(`update bike set engine_family = 'Vantor 103', displacement_cc = 1690 where id = ?`, [s.bike.id]);
  await conn.execute(`update bike set engine_family = 'Strata Inline-4', displacement_cc = 998 where id = ?`, [s.otherBike.id]);
  await conn.execute(
    `insert into stage (id, shop_id, bike_id, position, name, date, gain_peak_power_hp, gain_area_pct, gain_average_power_hp, total_cost_cents, created_at)
     values (gen_random_uuid(), ?, ?, 0, 'Baseline', '2025-01-10', null, null, null, 0, now()),
            (gen_random_uuid(), ?, ?, 1, 'Stage 1', '2025-02-10', 9.4, 6.1, 5.2, 120000, now()),
            (gen_random_uuid(), ?, ?, 1, 'Stage 1', '2025-03-10', 4.2, 3.0, 2.5, 60000, now())`,
    [s.shop.id, s.bike.id, s.shop.id, s.bike.id, s.shop.id, s.otherBike.id],
  );
  await conn.execute(
    `insert into part (id, shop_id, stage_id, category, description, part_cost_cents, labour_cost_cents, created_at)
     select gen_random_uuid(), st.shop_id, st.id, 'exhaust', 'Two-into-one header', 100000, 20000, now() from stage st where st.shop_id = ? and st.position = 1`,
    [s.shop.id],
  );
}, 120_000);
afterAll(() => h?.close());

describe('build finder page', () => {
  it('searches by engine family, shows the build and opens its bike', async () => {
    const page = await h.signInPage(s.users.owner.email);
    await page.goto(`${h.baseUrl}/finder`);
    await page.getByLabel('Engine family').fill('vantor 103');
    await page.getByRole('button', { name: 'Search builds' }).click();
    const table = page.getByRole('region', { name: 'Matching builds' });
    const link = table.getByRole('link', { name: /Testmake Own/ });
    await link.waitFor();
    // Only the matching engine family: the other bike's build is not listed.
    expect(await table.getByRole('link', { name: /Testmake Other/ }).count()).toBe(0);
    expect(await table.getByText('+9.4 hp').count()).toBe(1);
    await h.screenshot(page, 'finder-results');

    await page.setViewportSize({ width: 768, height: 1000 });
    await h.screenshot(page, 'finder-results-768');

    await link.click();
    await page.waitForURL((u) => u.pathname === `/bikes/${s.bike.id}`);
    expect(new URL(page.url()).pathname).toBe(`/bikes/${s.bike.id}`);
  });

  it('shows the empty state when nothing matches', async () => {
    const page = await h.signInPage(s.users.desk.email);
    await page.goto(`${h.baseUrl}/finder?engine=nothing-like-this`);
    await page.getByText('No builds match').waitFor();
    expect(await page.getByText('No builds match').isVisible()).toBe(true);
    // The filters come back into the form from the address.
    expect(await page.getByLabel('Engine family').inputValue()).toBe('nothing-like-this');

    // A displacement range the wrong way round is refused at the field and in an alert; nothing is searched.
    await page.getByLabel('Engine family').fill('');
    await page.getByLabel('Displacement from').fill('1600');
    await page.getByLabel('to', { exact: true }).fill('1200');
    await page.getByRole('button', { name: 'Search builds' }).click();
    const form = page.getByRole('form', { name: 'Search past builds' });
    await expect.poll(() => form.getByRole('alert').isVisible()).toBe(true);
    expect(await form.getByRole('alert').textContent()).toContain('The upper displacement is below the lower one');
    expect(await page.getByLabel('to', { exact: true }).getAttribute('aria-invalid')).toBe('true');
    expect(new URL(page.url()).searchParams.get('engine')).toBe('nothing-like-this');
    await h.screenshot(page, 'finder-filter-error');

    // Put right, the search runs with the range in cm³.
    await page.getByLabel('to', { exact: true }).fill('2000');
    await page.getByRole('button', { name: 'Search builds' }).click();
    await page.waitForURL((u) => u.searchParams.get('ccMax') === '2000');
    expect(new URL(page.url()).searchParams.get('ccMin')).toBe('1600');
    await page.getByRole('region', { name: 'Matching builds' }).getByRole('link', { name: /Testmake Own/ }).waitFor();
  });
});
