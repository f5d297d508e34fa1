/**
 * The foundation end to end, in a real browser: the front desk books in a customer and a bike
 * through the forms (found by their labels, as a screen reader or keyboard user would), the owner
 * gives that customer portal access, the customer sets a password from the e-mailed invitation and
 * then sees their own bike and none of the shop's others.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { startBrowserHarness, type BrowserHarness } from '../support/browser';
import { latestMailTo, linkIn } from '../support/mail';
import type { TestShop } from '../support/test-app';
import { SAFETY_CHECKS } from '@shared/schemas/run';
import { latestModelYear } from '@shared/schemas/bike';

// Invented example data.
const CUSTOMER = { name: 'Wren Halloway', email: 'wren.halloway@example.test', phone: '555-0142' };
const BIKE = { make: 'Corvale', model: 'Strata 1100', year: '2019', engineFamily: 'CV-67' };
// The worked example VIN of the 49 CFR Part 565 check-digit description (check digit X), and
// the same VIN with its 9th character changed so the check digit no longer matches.
const GOOD_VIN = '1M8GDM9AXKP042788';
const BAD_VIN = '1M8GDM9A1KP042788';
const NEW_PASSWORD = 'a-fresh-portal-password';

let h: BrowserHarness;
let shop: TestShop;
let customerUrl = '';
let bikeUrl = '';

beforeAll(async () => {
  h = await startBrowserHarness();
  shop = await h.t.createShop('Ridgeback Motor Works');
}, 120_000);

afterAll(async () => {
  await h?.close();
});

async function expectToast(page: Page, text: string | RegExp) {
  await expect.poll(() => page.getByText(text).first().isVisible(), { timeout: 10_000 }).toBe(true);
}

describe('foundation in the browser', () => {
  it('the front desk adds a customer and a bike through the forms', async () => {
    const page = await h.signInPage(shop.users.desk.email);
    await expect.poll(() => page.getByRole('heading', { name: 'Today', level: 1 }).isVisible()).toBe(true);
    // The dyno-operation cautions are on the staff start page: the session checklist's own list.
    const cautions = (await page.getByRole('note').filter({ hasText: 'Before every pull' }).textContent()) ?? '';
    for (const check of SAFETY_CHECKS) expect(cautions).toContain(check.label);
    await expect.poll(() => page.getByRole('region', { name: 'Newest customers' }).getByRole('link', { name: `${shop.customer.name}` }).isVisible()).toBe(true);
    await h.screenshot(page, 'foundation-01-desk-today');

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Customers' }).click();
    await page.getByRole('button', { name: 'New customer' }).click();
    const customerDialog = page.getByRole('dialog', { name: 'New customer' });
    // An empty name is refused before anything is sent.
    await customerDialog.getByRole('button', { name: 'Add customer' }).click();
    await expect.poll(() => customerDialog.getByText('Name is required', { exact: true }).isVisible()).toBe(true);
    // The field says so (described by its error) and an alert announces it.
    expect(await customerDialog.getByLabel('Name').getAttribute('aria-invalid')).toBe('true');
    expect(await customerDialog.getByRole('alert').textContent()).toContain('Name is required');
    await customerDialog.getByLabel('Name').fill(CUSTOMER.name);
    await customerDialog.getByLabel('E-mail').fill(CUSTOMER.email);
    await customerDialog.getByLabel('Phone').fill(CUSTOMER.phone);
    await h.screenshot(page, 'foundation-02-customer-form');
    await customerDialog.getByLabel('Phone').press('Enter');
    await page.waitForURL(/\/customers\/[0-9a-f-]{36}$/);
    customerUrl = page.url();
    await expect.poll(() => page.getByRole('heading', { name: CUSTOMER.name, level: 1 }).isVisible()).toBe(true);
    // Only the owner may invite; the desk is told so instead of being offered the button.
    expect(await page.getByRole('button', { name: 'Give portal access' }).count()).toBe(0);

    await page.getByRole('link', { name: 'Add bike' }).click();
    const bikeDialog = page.getByRole('dialog', { name: 'New bike' });
    await expect.poll(() => bikeDialog.getByLabel('Owner').inputValue()).not.toBe('');
    await expect.poll(() => bikeDialog.getByLabel('Owner').locator('option:checked').textContent()).toBe(CUSTOMER.name);
    await bikeDialog.getByLabel('Make').fill(BIKE.make);
    await bikeDialog.getByLabel('Model').fill(BIKE.model);
    // A model year after next year is refused, with the latest allowed year named.
    await bikeDialog.getByLabel('Year').fill(String(latestModelYear() + 1));
    await bikeDialog.getByLabel('Year').press('Tab');
    await expect.poll(() => bikeDialog.getByText(`Model year cannot be later than ${latestModelYear()}`).isVisible()).toBe(true);
    await bikeDialog.getByLabel('Year').fill(BIKE.year);
    await bikeDialog.getByLabel('VIN').fill(BAD_VIN);
    await bikeDialog.getByLabel('VIN').press('Tab');
    await expect.poll(() => bikeDialog.getByText('The check digit (9th character) does not match').isVisible()).toBe(true);
    await bikeDialog.getByLabel('VIN').fill(GOOD_VIN);
    await bikeDialog.getByLabel('Engine family').fill(BIKE.engineFamily);
    await bikeDialog.getByLabel('cubic inches').check();
    await bikeDialog.getByLabel('Displacement').fill('67');
    // 67 in³ × 16.387064 cm³/in³ (exact, NIST SP 811) = 1,097.93 cm³, shown rounded to 1,098 cm³.
    await expect.poll(() => bikeDialog.getByText('= 1,098 cm³ = 67.0 in³').isVisible()).toBe(true);
    await bikeDialog.getByLabel('Cylinders').fill('2');
    expect(await bikeDialog.getByText('does not match').count()).toBe(0);
    await h.screenshot(page, 'foundation-03-bike-form');
    await bikeDialog.getByRole('button', { name: 'Add bike' }).click();
    await page.waitForURL(/\/bikes\/[0-9a-f-]{36}$/);
    bikeUrl = page.url();
    const details = page.getByRole('region', { name: 'Bike details' });
    await expect.poll(() => details.isVisible()).toBe(true);
    const text = (await details.textContent()) ?? '';
    expect(text).toContain(GOOD_VIN);
    expect(text).toContain('1,098 cm³');
    expect(text).toContain('67.0 in³');
    expect(text).toContain(CUSTOMER.name);
    await h.screenshot(page, 'foundation-04-bike-page');

    // The bike list at tablet width, searched on the server.
    await page.setViewportSize({ width: 768, height: 1024 });
    await page.goto(`${h.baseUrl}/bikes`);
    await page.getByLabel('Search bikes').fill('Strata');
    await expect.poll(() => page.getByRole('table', { name: 'Bikes' }).locator('tbody tr').count()).toBe(1);
    expect(await page.getByRole('table', { name: 'Bikes' }).textContent()).toContain(BIKE.model);
    await h.screenshot(page, 'foundation-05-bikes-tablet');

    // A new bike with no owner chosen says what is missing, at the field and in an alert.
    await page.getByRole('button', { name: 'New bike' }).click();
    const emptyBike = page.getByRole('dialog', { name: 'New bike' });
    await emptyBike.getByRole('button', { name: 'Add bike' }).click();
    await expect.poll(() => emptyBike.getByText("Choose the bike's owner", { exact: true }).isVisible()).toBe(true);
    expect(await emptyBike.getByLabel('Owner').getAttribute('aria-invalid')).toBe('true');
    expect(await emptyBike.getByRole('alert').textContent()).toContain("Choose the bike's owner");
    expect(await emptyBike.getByText('Not a valid id').count()).toBe(0);
    await h.screenshot(page, 'foundation-05b-bike-form-errors');
    await page.context().close();
  });

  it('the owner gives the customer portal access and the invitation is e-mailed', async () => {
    expect(customerUrl).not.toBe('');
    const page = await h.signInPage(shop.users.owner.email);
    await page.goto(customerUrl);
    await page.getByRole('button', { name: 'Give portal access' }).click();
    const dialog = page.getByRole('dialog', { name: 'Give portal access' });
    expect(await dialog.getByLabel('E-mail for signing in').inputValue()).toBe(CUSTOMER.email);
    expect(await dialog.getByLabel('Name on the account').inputValue()).toBe(CUSTOMER.name);
    await dialog.getByRole('button', { name: 'Send invitation' }).click();
    await expectToast(page, `Invitation sent to ${CUSTOMER.email}`);
    await expect.poll(() => page.getByText('Has a sign-in').isVisible()).toBe(true);
    await h.screenshot(page, 'foundation-06-owner-customer-page');

    // The owner's settings show the new sign-in and the mail that went out.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Users' }).click();
    const users = page.getByRole('table', { name: 'Users of this shop' });
    await expect.poll(async () => (await users.textContent()) ?? '').toContain(CUSTOMER.email);
    expect(await users.getByRole('row').filter({ hasText: CUSTOMER.email }).textContent()).toContain('Invitation sent');
    await h.screenshot(page, 'foundation-06b-owner-users');
    // The invitation form sent empty: errors at the fields and in an announced alert.
    const invite = page.getByRole('region', { name: 'Invite a colleague' });
    await invite.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => invite.getByRole('alert').isVisible()).toBe(true);
    const inviteAlert = (await invite.getByRole('alert').textContent()) ?? '';
    expect(inviteAlert).toContain('Name is required');
    expect(inviteAlert).toContain('Enter a valid e-mail address');
    expect(await invite.getByLabel('E-mail').getAttribute('aria-invalid')).toBe('true');
    // Role selects are wide enough for the longest role name.
    const roleSelect = users.getByRole('combobox').first();
    expect(await roleSelect.evaluate((el) => el.scrollWidth <= el.clientWidth && el.getBoundingClientRect().width >= 150)).toBe(true);
    await h.screenshot(page, 'foundation-06d-owner-invite-errors');

    // The audit log speaks plainly and links what it can.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Audit log' }).click();
    const audit = page.getByRole('region', { name: 'Audit log' });
    await expect.poll(() => audit.getByRole('link', { name: CUSTOMER.name }).first().isVisible()).toBe(true);
    expect(await audit.textContent()).toContain(`Added customer ${CUSTOMER.name}`);
    expect(await audit.textContent()).toContain(`Added bike ${BIKE.make} ${BIKE.model}`);
    await page.getByLabel('Kind of change').selectOption({ label: 'Bikes' });
    // The server narrows the log (the old rows stay up while it loads): wait for the narrowed answer.
    const narrowed = async () => {
      const text = (await audit.textContent()) ?? '';
      return !text.includes('Added customer') && text.includes(`Added bike ${BIKE.make} ${BIKE.model}`);
    };
    await expect.poll(narrowed).toBe(true);
    await h.screenshot(page, 'foundation-06e-owner-audit');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Outbox' }).click();
    const outbox = page.getByRole('table', { name: 'Captured mail' });
    await outbox.getByRole('row').filter({ hasText: CUSTOMER.email }).first().getByRole('button').click();
    const message = page.getByRole('dialog', { name: /invited to Ridgeback Motor Works/ });
    await expect.poll(async () => (await message.textContent()) ?? '').toContain('/invite/');
    await h.screenshot(page, 'foundation-06c-owner-outbox');
    await page.context().close();

    // Settings are the owner's alone: the desk is told so rather than shown a broken form.
    const desk = await h.signInPage(shop.users.desk.email);
    await desk.goto(`${h.baseUrl}/settings/shop`);
    await expect.poll(() => desk.getByText('Not for your role').isVisible()).toBe(true);
    await desk.context().close();
  });

  it('the customer sets a password from the invitation and sees only their own bike', async () => {
    const mail = await latestMailTo(CUSTOMER.email);
    const token = linkIn(mail.text, '/invite/');
    const { context, page } = await h.newPage();
    const consoleLines: string[] = [];
    page.on('console', (m) => consoleLines.push(`${m.type()}: ${m.text()}`));
    await page.goto(`${h.baseUrl}/invite/${token}`);
    await expect.poll(() => page.getByRole('heading', { name: 'Set up your account' }).isVisible()).toBe(true);
    // The page says whose invitation it is before anyone types a password.
    expect(await page.getByText(`Invitation for ${CUSTOMER.name}`).isVisible()).toBe(true);
    await page.getByLabel('New password').fill(NEW_PASSWORD);
    await page.getByLabel('Type the password again').fill(`${NEW_PASSWORD}-typo`);
    await page.getByRole('button', { name: 'Set password and sign in' }).click();
    await expect.poll(() => page.getByText('The two passwords are not the same', { exact: true }).isVisible()).toBe(true);
    expect(await page.getByRole('alert').textContent()).toContain('The two passwords are not the same');
    await page.getByLabel('Type the password again').fill(NEW_PASSWORD);
    await h.screenshot(page, 'foundation-07-invite-page');
    await page.getByRole('button', { name: 'Set password and sign in' }).click();
    await page.waitForURL(`${h.baseUrl}/`);

    await expect.poll(() => page.getByRole('heading', { name: 'My bikes', level: 1 }).isVisible()).toBe(true);
    const list = page.getByRole('list', { name: 'My bikes' });
    await expect.poll(() => list.getByRole('listitem').count()).toBe(1);
    const listed = (await list.textContent()) ?? '';
    expect(listed).toContain(`${BIKE.year} ${BIKE.make} ${BIKE.model}`);
    // The shop's other bikes (made by createShop) are not shown.
    expect(listed).not.toContain('Testmake');
    // Nor does the API hand them over behind the screen.
    const api = await page.evaluate(async () => (await fetch('/api/bikes')).json());
    const items = (Array.isArray(api) ? api : api.items) as { id: string }[];
    expect(items.map((b) => b.id)).toEqual([bikeUrl.split('/').pop()]);
    // Staff navigation is not offered to a customer.
    expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Customers' }).count()).toBe(0);
    await h.screenshot(page, 'foundation-08-customer-my-bikes');

    await list.getByRole('link').click();
    await page.waitForURL(bikeUrl);
    await expect.poll(() => page.getByRole('region', { name: 'Bike details' }).isVisible()).toBe(true);
    expect(await page.getByRole('button', { name: 'Edit bike' }).count()).toBe(0);
    await h.screenshot(page, 'foundation-09-customer-bike-page');

    // Another customer's bike answers "not found" on screen too.
    await page.goto(`${h.baseUrl}/bikes/${shop.otherBike.id}`);
    await expect.poll(() => page.getByText('No such bike').isVisible()).toBe(true);

    // Staff-only pages typed by address: told plainly, not a screen of 403s.
    for (const path of ['/finder', '/customers', '/bikes']) {
      await page.goto(`${h.baseUrl}${path}`);
      await expect.poll(() => page.getByText('Not available for your role').isVisible()).toBe(true);
      expect(await page.getByRole('button', { name: /Search builds|New customer|New bike/ }).count()).toBe(0);
    }
    await h.screenshot(page, 'foundation-10-customer-staff-page');
    // Full page loads render a loading state while the page's code arrives: no router warning.
    expect(consoleLines.filter((l) => l.includes('HydrateFallback'))).toEqual([]);
    await context.close();
  });
});
