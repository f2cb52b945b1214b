import type { Locator, Page } from '@playwright/test';
import { DEMO_RAILWAY, VIEWPORTS, expect, screenshotBoth, test } from './fixtures';
import { LayoutPage } from './pages/layout-page';

/** Scrolls the page (not the table) so the row is on screen, then asks whether the button is really visible. */
async function expectButtonInView(page: Page, button: Locator) {
  await button.evaluate((el) => window.scrollTo(0, el.getBoundingClientRect().top + window.scrollY - 200));
  // IntersectionObserver clips by every scrolling ancestor, so a button hidden past the table's right edge fails.
  await expect(button).toBeInViewport({ ratio: 0.9 });
}

/** Tables of the open tab whose box scrolls sideways (content wider than the card gives it). */
async function tablesScrollingSideways(page: Page, testIds: readonly string[]) {
  const out: string[] = [];
  for (const id of testIds) {
    const box = page.getByTestId(id).locator('xpath=..');
    const { scroll, client } = await box.evaluate((el) => ({ scroll: el.scrollWidth, client: el.clientWidth }));
    if (scroll > client) out.push(`${id}: ${scroll} px in ${client} px`);
  }
  return out;
}

const TABLES = { 'Blocks & links': ['blocks-table'], Power: ['supplies-table', 'drivers-table', 'cabs-table'], 'Rolling stock': ['locomotives-table', 'trains-table'] } as const;

test('wide tables keep their Add buttons in view at laptop and phone widths', async ({ page, signInAs, railwayPage }) => {
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  await railwayPage.openTab('Layouts');
  await page.getByTestId('layout-list').getByRole('link').first().click();
  const layout = new LayoutPage(page);
  for (const size of Object.values(VIEWPORTS)) {
    await page.setViewportSize(size);
    await layout.openTab('Blocks & links');
    await expectButtonInView(page, page.getByTestId('block-new-row').getByRole('button', { name: 'Add block' }));
    await layout.openTab('Power');
    await expectButtonInView(page, page.getByTestId('driver-new-row').getByRole('button', { name: 'Add driver' }));
    await expectButtonInView(page, page.getByRole('button', { name: /^Delete driver/ }).first());
    await layout.openTab('Rolling stock');
    await expectButtonInView(page, page.getByTestId('locomotive-new-row').getByRole('button', { name: 'Add locomotive' }));
    await expectButtonInView(page, page.getByTestId('train-new-row').getByRole('button', { name: 'Add train' }));
  }
  await layout.openTab('Power');
  await screenshotBoth(page, 'power-tables');
});

test('issue 13 point 5: at laptop width no table of either demo layout scrolls sideways inside its card', async ({ page, signInAs, railwayPage }) => {
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  const railwayUrl = page.url();
  const layout = new LayoutPage(page);
  await page.setViewportSize(VIEWPORTS.laptop);
  for (const name of ['Kestrel Vale branch (H0)', 'Quillon garden line (IIm)']) {
    await page.goto(`${railwayUrl}/layouts`);
    await page.getByTestId('layout-list').getByRole('link', { name }).click();
    await expect(page.getByTestId('layout-name')).toHaveText(name);
    for (const [tab, ids] of Object.entries(TABLES)) {
      await layout.openTab(tab);
      for (const id of ids) await expect(page.getByTestId(id)).toBeVisible();
      expect(await tablesScrollingSideways(page, ids), `${name}, ${tab}`).toEqual([]);
    }
    // The PWM duty tables under the trains, opened: their notes wrap rather than widen the table.
    const duty = page.getByTestId('duty-table');
    for (const details of await duty.all()) await details.locator('summary').click();
    const wide = await duty.locator('table').evaluateAll((tables) => tables.filter((t) => t.parentElement!.scrollWidth > t.parentElement!.clientWidth).length);
    expect(wide, `${name}, duty tables`).toBe(0);
  }
  // The driver's further ratings sit on a line under its main cells, each with its heading, and still edit.
  await layout.openTab('Power');
  const driver = page.getByTestId('driver-row').first();
  await expect(driver.getByText('Peak holds', { exact: true })).toBeVisible();
  await expect(driver.getByRole('textbox', { name: /^Peak holds of driver/ })).toBeVisible();
  await expect(page.getByTestId('drivers-table').getByRole('columnheader', { name: /Peak holds/ })).toHaveCount(0);
  await layout.openTab('Blocks & links');
  await screenshotBoth(page, 'blocks-table-garden');
});

test('a new layout: the scale reads whole, locomotives start from stated figures, cabs take free channels', async ({ page, signInAs, railwayPage }) => {
  test.setTimeout(120_000);
  const layout = new LayoutPage(page);
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  await railwayPage.openTab('Layouts');
  const scale = page.getByLabel('Scale', { exact: true });
  await scale.selectOption({ label: 'H0 (NEM) — 1:87, 16.5 mm' });
  for (const size of Object.values(VIEWPORTS)) {
    await page.setViewportSize(size);
    // The closed drop-down is wide enough for its chosen label (text width measured in the select's own font).
    const fits = await scale.evaluate((el: HTMLSelectElement) => {
      const style = getComputedStyle(el);
      const ctx = document.createElement('canvas').getContext('2d')!;
      ctx.font = `${style.fontWeight} ${style.fontSize} ${style.fontFamily}`;
      const text = ctx.measureText(el.selectedOptions[0]!.text).width;
      const room = el.clientWidth - parseFloat(style.paddingLeft) - parseFloat(style.paddingRight) - 16; // 16 px: the arrow (common practice)
      return { text, room };
    });
    expect(fits.text).toBeLessThanOrEqual(fits.room);
  }
  await page.getByLabel('Name', { exact: true }).fill('Mill siding');
  await page.getByRole('button', { name: 'Create layout' }).click();
  await expect(page.getByTestId('layout-name')).toHaveText('Mill siding');

  await layout.openTab('Power');
  await layout.addRow('supply', { Name: 'Shelf supply', Volts: '12', 'Rated current': '2' });
  const driverRow = page.getByTestId('driver-new-row');
  await driverRow.getByLabel('Supply of new driver').selectOption({ label: 'Shelf supply' });
  await driverRow.getByLabel('Class of new driver').selectOption({ label: 'MOSFET dual, low voltage, 1.2 A class' });
  await driverRow.getByRole('button', { name: 'Add driver' }).click();
  await expect(page.getByTestId('driver-row')).toHaveCount(1);
  // One driver with two channels: the first cab gets channel 1, the next channel 2, then none is left.
  const cabRow = page.getByTestId('cab-new-row');
  await expect(cabRow.getByLabel('Channel of new cab')).toHaveValue('1');
  await layout.addRow('cab', { Name: 'Cab A' });
  await expect(cabRow.getByLabel('Channel of new cab')).toHaveValue('2');
  await layout.addRow('cab', { Name: 'Cab B' });
  await expect(cabRow.getByLabel('Channel of new cab')).toHaveValue('');
  // Two cabs and no trains yet: the budget says so instead of "no cab on this supply".
  const supplyBudget = page.getByTestId('supply-budget').filter({ hasText: 'Shelf supply' });
  await expect(supplyBudget).toContainText('no trains yet');
  await expect(supplyBudget).toContainText('(2 cabs)');
  await expect(supplyBudget).not.toContainText('no cab on this supply');
  await page.setViewportSize(VIEWPORTS.phone);
  await expect(supplyBudget).toBeVisible();
  await expect(cabRow.getByLabel('Channel of new cab')).toHaveValue('');
  await page.setViewportSize(VIEWPORTS.laptop);

  await layout.openTab('Rolling stock');
  const locomotiveRow = page.getByTestId('locomotive-new-row');
  // Real starting figures, said as such (common practice for a modern HO can motor; NEM 630 Table 1: 12 V for 16.5 mm gauge).
  await expect(page.getByTestId('locomotive-defaults')).toContainText('0.5 A running and 0.9 A stalled');
  await expect(page.getByTestId('locomotive-defaults')).toContainText('rated 12 V (NEM 630 for 16.5 mm gauge)');
  await expect(locomotiveRow.getByLabel('Running of new locomotive', { exact: true })).toHaveValue('0.5');
  await expect(locomotiveRow.getByLabel('Stall of new locomotive', { exact: true })).toHaveValue('0.9');
  await expect(locomotiveRow.getByLabel('Rated of new locomotive', { exact: true })).toHaveValue('12');
  for (const field of ['Running', 'Stall', 'Rated']) await expect(locomotiveRow.getByLabel(`${field} of new locomotive`, { exact: true })).not.toHaveAttribute('placeholder');
  await layout.addRow('locomotive', { Name: 'Mill shunter', 'Top speed at rated': '40' });
  await expect(page.getByLabel('Rated of locomotive Mill shunter', { exact: true })).toHaveValue('12');
  // On a phone the stated figures are read above the table, and Add stays in reach.
  await page.setViewportSize(VIEWPORTS.phone);
  await expect(page.getByTestId('locomotive-defaults')).toBeVisible();
  await expectButtonInView(page, locomotiveRow.getByRole('button', { name: 'Add locomotive' }));
  await page.setViewportSize(VIEWPORTS.laptop);
  await screenshotBoth(page, 'stock-new-layout');
});
