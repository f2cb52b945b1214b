import { DEMO_RAILWAY, expect, screenshotBoth, test } from './fixtures';
import { LayoutPage } from './pages/layout-page';

test('a planner builds a small layout, fixes a CSV import by its row number and reads the power budget', async ({ page, signInAs, railwayPage }) => {
  test.setTimeout(180_000);
  const layout = new LayoutPage(page);
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  await railwayPage.openTab('Layouts');
  await expect(page.getByTestId('layout-list')).toContainText('H0');
  await screenshotBoth(page, 'layouts-list');

  // A new layout from the scale table.
  await page.getByLabel('Name', { exact: true }).fill('Harbour spur');
  await page.getByLabel('Scale', { exact: true }).selectOption({ label: 'H0 (NEM) — 1:87, 16.5 mm' });
  await page.getByRole('button', { name: 'Create layout' }).click();
  await expect(page.getByTestId('layout-name')).toHaveText('Harbour spur');
  await expect(layout.tab('Blocks & links')).toHaveAttribute('aria-current', 'page');

  // Blocks in metres; the next position follows on from the last block.
  await page.getByLabel('Lengths in').selectOption('m');
  await layout.addRow('block', { Name: 'Quay road', Length: '1.5' });
  await expect(page.getByTestId('block-new-row').getByLabel('Position on the line of new block')).toHaveValue('1.5');
  await layout.addRow('block', { Name: 'Harbour curve', Length: '2' });
  await layout.addRow('block', { Name: 'Junction', Length: '1.2' });
  await expect(page.getByTestId('unlinked-warning')).toContainText('Quay road');
  await layout.link('Quay road', 'Harbour curve');
  await layout.link('Harbour curve', 'Junction');
  await expect(page.getByTestId('unlinked-warning')).toHaveCount(0);
  await expect(page.getByTestId('blocks-table')).toContainText('Quay road, Junction');
  // An edit in place: the junction is 1.25 m long.
  await page.getByLabel('Length of block Junction').fill('1.25');
  await expect(page.getByRole('button', { name: 'Save block Junction' })).toBeEnabled();
  await page.getByLabel('Length of block Junction').press('Enter');
  await expect(page.getByRole('button', { name: 'Save block Junction' })).toBeDisabled();
  await page.reload();
  await expect(page.getByLabel('Length of block Junction')).toHaveValue('1.25');
  await screenshotBoth(page, 'layouts-track');
  // The links CSV names each rail joint's ends; blank ends follow the line's position order (the block
  // further along meets at its a end), and a joint already there is unchanged.
  await layout.checkCsv('links', 'block_a,block_b,block_a_end,block_b_end\nQuay road,Harbour curve,,\nJunction,Quay road,a,a\n');
  const linksPreview = layout.csv('links').getByTestId('csv-preview');
  await expect(linksPreview).toContainText('Quay road (b) — Harbour curve (a)');
  await expect(linksPreview).toContainText('Junction (a) — Quay road (a)');
  await expect(layout.csv('links').getByRole('button', { name: 'Import 1 row' })).toBeVisible();
  await screenshotBoth(page, 'layouts-csv-links');

  // Power: a supply, a driver from a preset, two cabs.
  await layout.openTab('Power');
  await expect(page.getByTestId('safety-cautions')).toContainText('shoot-through');
  await layout.addRow('supply', { Name: 'Bench supply', Volts: '12', 'Rated current': '2' });
  const driverRow = page.getByTestId('driver-new-row');
  await driverRow.getByLabel('Supply of new driver').selectOption({ label: 'Bench supply' });
  await driverRow.getByLabel('Class of new driver').selectOption({ label: 'MOSFET dual, low voltage, 1.2 A class' });
  await expect(driverRow.getByLabel('A / channel of new driver')).toHaveValue('1.2');
  await driverRow.getByRole('button', { name: 'Add driver' }).click();
  await expect(page.getByTestId('driver-row')).toHaveCount(1);
  await layout.addRow('cab', { Name: 'Cab A', Channel: '1' }, { Driver: 'MOSFET dual, low voltage, 1.2 A class (2 ch.)' });
  // A channel holds one cab: the same channel again is refused beside the field.
  await page.getByTestId('cab-new-row').getByLabel('Name of new cab').fill('Cab B');
  await page.getByTestId('cab-new-row').getByLabel('Channel of new cab').fill('1');
  await page.getByTestId('cab-new-row').getByRole('button', { name: 'Add cab' }).click();
  await expect(page.getByTestId('cab-new-row')).toContainText('is already cab “Cab A”');
  await page.getByTestId('cab-new-row').getByLabel('Channel of new cab').fill('2');
  await page.getByTestId('cab-new-row').getByRole('button', { name: 'Add cab' }).click();
  await expect(page.getByTestId('cab-row')).toHaveCount(2);

  // Rolling stock: a locomotive by hand, a train, then more locomotives from CSV.
  await layout.openTab('Rolling stock');
  // Calibration: top speed at the rated voltage, and the voltage at which it starts to move (common practice 1.5–3 V).
  await layout.addRow('locomotive', { Name: 'Harbour tank', Running: '0.35', Stall: '0.9', Rated: '12', 'Top speed at rated': '60', 'Starts moving at': '2' });
  const trainRow = page.getByTestId('train-new-row');
  await trainRow.getByLabel('Add a locomotive to Consist of new train').selectOption({ label: 'Harbour tank' });
  await page.getByLabel('Lengths in').first().selectOption('mm');
  await layout.addRow('train', { Name: 'Fish train', Lighting: '0.02', Length: '700' });
  // Running 0.35 + 0.02 lighting = 0.37 A; at start, under a PWM ramp, 0.9 A stall × 2 V / 12 V = 0.15 A,
  // less than its running current, so the start also draws 0.37 A.
  await expect(page.getByTestId('trains-table')).toContainText('0.37 A / 0.37 A');

  const bad = 'name,running_amps,stall_amps,rated_volts,top_speed_kmh\nQuay shunter,0.25,0.7,12,40\nHarbour diesel,0.4,lots,12,80\n';
  await layout.checkCsv('locomotives', bad);
  await expect(layout.csv('locomotives').getByTestId('csv-issues')).toContainText('Row 3');
  await expect(layout.csv('locomotives').getByTestId('csv-issues')).toContainText('stall_amps');
  await expect(layout.csv('locomotives').getByRole('button', { name: /^Import \d/ })).toHaveCount(0);
  await screenshotBoth(page, 'layouts-csv-error');
  await layout.checkCsv('locomotives', bad.replace('lots', '1.0'));
  await expect(layout.csv('locomotives').getByTestId('csv-issues')).toHaveCount(0);
  await layout.csv('locomotives').getByRole('button', { name: 'Import 2 rows' }).click();
  await expect(layout.csv('locomotives')).toContainText('Imported: 2 new, 0 changed, 0 unchanged.');
  await expect(page.getByTestId('locomotive-row')).toHaveCount(3);
  await page.getByTestId('duty-table').first().locator('summary').click();
  await expect(page.getByTestId('duty-tables')).toContainText('Calibrated model');
  await screenshotBoth(page, 'layouts-stock');

  // The power budget traces each figure.
  await layout.openTab('Power');
  const supply = page.getByTestId('supply-budget');
  // 2 A × 0.8 = 1.6 A; the one train is 0.35 + 0.02 = 0.37 A running.
  await expect(supply).toContainText('2 A × 0.8 = 1.6 A');
  await expect(supply).toContainText('0.37 A (Fish train)');
  const driver = page.getByTestId('driver-budget');
  // TB6612FNG: drop = 0.5 Ω × 0.37 A = 0.185 V, so 12 − 0.185 = 11.815 V at the rails, below NEM 630's 12 V for H0.
  await expect(driver).toContainText(/12 V supply − 0\.19 V bridge drop at 0\.37 A = 11\.8\d V/);
  // Its 3.2 A peak holds for a single 10 ms pulse: the 2 s start is judged against 1.2 A.
  await expect(driver).toContainText('1.2 A continuous');
  await expect(driver).toContainText('Toshiba TB6612FNG datasheet (2014)');
  await screenshotBoth(page, 'layouts-power');
});

test('an operator reads a layout but gets no editing controls', async ({ page, signInAs, railwayPage }) => {
  await signInAs('operator');
  await railwayPage.openFromList(DEMO_RAILWAY);
  await railwayPage.openTab('Layouts');
  await expect(page.getByRole('heading', { name: 'New layout' })).toHaveCount(0);
  await page.getByTestId('layout-list').getByRole('link').first().click();
  const layout = new LayoutPage(page);
  await layout.openTab('Power');
  await expect(page.getByTestId('power-budget')).toBeVisible();
  await expect(page.getByTestId('supply-new-row')).toHaveCount(0);
  await expect(page.getByRole('button', { name: /^Delete/ })).toHaveCount(0);
  await layout.openTab('Blocks & links');
  await expect(page.getByTestId('block-row').first()).toBeVisible();
  await expect(page.getByText('Import blocks from CSV')).toHaveCount(0);
  await screenshotBoth(page, 'layouts-operator-track');
});
