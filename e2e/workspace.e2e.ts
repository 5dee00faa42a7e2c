/**
 * The room workspace end to end, as a new user meets it: the demo tuner signs in, opens the 2.4 GHz
 * chip-antenna room and sees the mismatch; the match finder proposes networks (a hover previews one);
 * the tuner builds the L-section it proposes from the palette, typing values in engineering notation,
 * tunes it from the keyboard, and watches the band trace come inside the goal and the bandwidth figure
 * appear; a finder candidate applied in one edit is taken back with Ctrl+Z. Screenshots go to
 * e2e/screenshots/ (workspace-*.png) at a 1366×768 laptop size.
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CHIP_ANTENNA_ROOM, DEMO_PASSWORD } from '../shared/demo/designs';
import { signIn } from './support/auth';
import { launchBrowser, openSession, type BrowserSession } from './support/browser';
import { startTestServer, type TestServer } from './support/server';
import { chainLayout, RAIL_Y } from '../client/features/workspace/chain/chain-layout';

let server: TestServer;
let browser: Browser;
let tuner: BrowserSession;

beforeAll(async () => {
  server = await startTestServer({ seedDemo: true });
  browser = await launchBrowser();
  tuner = await openSession(browser, server.url, { viewport: { width: 1366, height: 768 } });
});

afterAll(async () => {
  await tuner?.close();
  await browser?.close();
  await server?.close();
});

const workspace = (page: Page) => page.getByTestId('workspace');
const summaryWorst = (page: Page) => page.getByTestId('summary-worst');
const summaryBandwidth = (page: Page) => page.getByTestId('summary-bandwidth');
const inspector = (page: Page) => page.getByTestId('element-inspector');
const chainList = (page: Page) => page.getByTestId('chain-list');

async function openTab(page: Page, name: string) {
  // A tab's name may carry its badge ("Element, C1").
  await page.getByRole('tab', { name: new RegExp(`^${name}(,|$)`) }).click();
}

/** Types a value into a labelled field of the element inspector and commits it with Enter. */
async function typeValue(page: Page, label: string, text: string) {
  const field = inspector(page).getByLabel(label, { exact: true });
  await field.fill(text);
  await field.press('Enter');
}

describe('room workspace', () => {
  it('opens the demo room and shows the mismatch', async () => {
    const { page } = tuner;
    await signIn(page, 'tuner@demo.test', DEMO_PASSWORD);
    await page.getByRole('link', { name: CHIP_ANTENNA_ROOM }).click();
    await workspace(page).waitFor();
    await page.locator('[data-testid="workspace"][data-synced="true"]').waitFor();
    await summaryWorst(page).getByText('outside goal').waitFor();
    await summaryBandwidth(page).getByText('no match').waitFor();
    await page.getByTestId('connection-status').getByText('Live').waitFor();
    // A tuner gets the palette and the undo buttons.
    await page.getByRole('toolbar', { name: 'Add an element' }).waitFor();
    await page.getByRole('button', { name: 'Undo', exact: true }).waitFor();
    // Nothing on screen reads NaN or Infinity.
    expect(await workspace(page).innerText()).not.toMatch(/NaN|Infinity/);
    await tuner.screenshot('workspace-01-mismatch');
    tuner.assertClean();
  });

  it('gives the Smith chart most of the height, with resizable panes worked from the keyboard', async () => {
    const { page } = tuner;
    const chart = (await page.getByTestId('chart-pane').boundingBox())!;
    const plot = (await page.getByTestId('plot-pane').boundingBox())!;
    const chain = (await page.getByRole('region', { name: 'Chain canvas' }).boundingBox())!;
    const side = (await page.getByRole('complementary', { name: 'Side panel' }).boundingBox())!;
    // At 1366×768 the chart is at least 420 px across, the plot and the chain canvas beside it.
    expect(chart.width).toBeGreaterThanOrEqual(420);
    expect(chart.height).toBeGreaterThanOrEqual(420);
    expect(plot.width).toBeGreaterThanOrEqual(300);
    expect(plot.height).toBeGreaterThanOrEqual(150);
    expect(chain.y + chain.height).toBeLessThanOrEqual(768);
    expect(side.width).toBeGreaterThanOrEqual(300);
    expect(side.x + side.width).toBeLessThanOrEqual(1366);
    // The divider before the side panel: a separator with its position, moved with the arrow keys.
    const divider = page.getByRole('separator', { name: 'Resize the side panel' });
    const before = Number(await divider.getAttribute('aria-valuenow'));
    await divider.focus();
    await page.keyboard.press('ArrowLeft');
    await page.keyboard.press('ArrowLeft');
    await expect.poll(async () => Number(await divider.getAttribute('aria-valuenow'))).toBe(before + 32);
    await expect.poll(async () => (await page.getByRole('complementary', { name: 'Side panel' }).boundingBox())!.width).toBeCloseTo(before + 32, 0);
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('ArrowRight');
    await expect.poll(async () => Number(await divider.getAttribute('aria-valuenow'))).toBe(before);
    // The chart's own divider narrows it from the keyboard too.
    const chartDivider = page.getByRole('separator', { name: 'Resize the Smith chart' });
    const chartBefore = Number(await chartDivider.getAttribute('aria-valuenow'));
    await chartDivider.focus();
    await page.keyboard.press('ArrowLeft');
    await expect.poll(async () => Number(await chartDivider.getAttribute('aria-valuenow'))).toBe(chartBefore - 16);
    await page.keyboard.press('ArrowRight');
    await expect.poll(async () => Number(await chartDivider.getAttribute('aria-valuenow'))).toBe(chartBefore);
    tuner.assertClean();
  });

  it('grows the chart on a 1920×1080 screen', async () => {
    const wide = await openSession(browser, server.url, { viewport: { width: 1920, height: 1080 } });
    try {
      await signIn(wide.page, 'tuner@demo.test', DEMO_PASSWORD);
      await wide.page.getByRole('link', { name: CHIP_ANTENNA_ROOM }).click();
      await wide.page.locator('[data-testid="workspace"][data-synced="true"]').waitFor();
      await summaryWorst(wide.page).getByText('outside goal').waitFor();
      const chart = (await wide.page.getByTestId('chart-pane').boundingBox())!;
      expect(chart.width).toBeGreaterThanOrEqual(650);
      const plot = (await wide.page.getByTestId('plot-pane').boundingBox())!;
      expect(plot.width).toBeGreaterThanOrEqual(500);
      await wide.screenshot('workspace-00-wide-1920');
      wide.assertClean();
    } finally {
      await wide.close();
    }
  });

  it('lists match-finder candidates with their figures and previews one on hover', async () => {
    const { page } = tuner;
    await openTab(page, 'Match finder');
    await page.getByRole('button', { name: 'Find matches' }).click();
    const lsection = page.getByTestId('match-candidate').filter({ hasText: 'L-section: series L, shunt C' });
    await lsection.waitFor();
    await lsection.getByText(/bandwidth \d/).first().waitFor();
    await lsection.getByText('meets the goal').first().waitFor();
    // E-series alternatives are offered beside the exact values.
    await lsection.getByRole('button', { name: /with E12 values/ }).waitFor();
    await lsection.hover();
    await lsection.getByRole('button', { name: 'Preview' }).click();
    await lsection.getByRole('button', { name: 'Previewing' }).waitFor();
    await tuner.screenshot('workspace-02-finder-preview');
    // A preview changes nothing in the room.
    await summaryWorst(page).getByText('outside goal').waitFor();
    tuner.assertClean();
  });

  it('builds the L-section from the palette, typing values with units, and the band trace comes inside the goal', async () => {
    const { page } = tuner;
    const palette = page.getByRole('toolbar', { name: 'Add an element' });

    // From the load outward: series L first, then the shunt C on its port side.
    await palette.getByRole('button', { name: 'Add series l' }).click();
    await inspector(page).getByRole('heading', { name: /L1/ }).waitFor();
    await typeValue(page, 'Value (H)', '0.93n');
    await expect.poll(() => inspector(page).getByLabel('Value (H)', { exact: true }).inputValue()).toBe('930 pH');

    // A value in the wrong unit is refused beside the field, and nothing is written.
    await typeValue(page, 'Value (H)', '1.7 pF');
    await inspector(page).getByRole('alert').getByText(/farads.*expected henries/).waitFor();
    await inspector(page).getByLabel('Value (H)', { exact: true }).press('Escape');
    await expect.poll(() => inspector(page).getByLabel('Value (H)', { exact: true }).inputValue()).toBe('930 pH');

    await palette.getByRole('button', { name: 'Add shunt c' }).click();
    await inspector(page).getByRole('heading', { name: /C1/ }).waitFor();
    await typeValue(page, 'Value (F)', '1.74 pF');

    // The chain reads port -> load: C1 then L1.
    await expect.poll(() => chainList(page).getByRole('button').allInnerTexts()).toEqual(['C1, shunt C, 1.74 pF', 'L1, series L, 930 pH']);
    await summaryWorst(page).getByText('in goal').waitFor();
    await summaryBandwidth(page).getByText(/MHz \(\d/).waitFor();

    await openTab(page, 'Figures');
    await page.getByTestId('figure-worst').getByText('meets the goal').waitFor();
    await page.getByTestId('figure-bandwidth').getByText('covers the band').waitFor();
    // The demo drives 100 mW: each part's stress is shown with the cautions beside it.
    await page.getByRole('table').getByRole('rowheader', { name: 'C1' }).waitFor();
    await page.getByRole('complementary', { name: 'Cautions for transmitting designs' }).getByText(/RF exposure limits/).waitFor();
    expect(await workspace(page).innerText()).not.toMatch(/NaN|Infinity/);
    await tuner.screenshot('workspace-03-lsection-in-goal');
    tuner.assertClean();
  });

  it('tunes the selected value from the keyboard: log steps, Shift coarse, E-series steps', async () => {
    const { page } = tuner;
    await openTab(page, 'Element');
    await chainList(page).getByRole('button', { name: /^C1,/ }).click();
    const field = inspector(page).getByLabel('Value (F)', { exact: true });
    await field.focus();
    await field.press('ArrowUp'); // +2 %
    await expect.poll(() => field.inputValue()).toBe('1.775 pF');
    await field.press('Shift+ArrowDown'); // -10 % (log scale: ×1/1.1)
    await expect.poll(() => field.inputValue()).toBe('1.614 pF');
    await page.getByLabel('Tuning steps').selectOption('E24');
    await field.focus();
    await field.press('ArrowUp'); // next E24 value above 1.614 pF
    await expect.poll(() => field.inputValue()).toBe('1.8 pF');

    // The chain canvas tunes the selected element with the arrow keys too.
    const canvas = page.getByRole('group', { name: /^Chain, port on the left/ });
    await canvas.focus();
    await page.keyboard.press('ArrowDown');
    await expect.poll(() => field.inputValue()).toBe('1.6 pF');
    await page.keyboard.press('ArrowUp');
    await expect.poll(() => field.inputValue()).toBe('1.8 pF');
    await summaryWorst(page).getByText('in goal').waitFor();
    tuner.assertClean();
  });

  it('applies a finder candidate in one edit that Ctrl+Z takes back', async () => {
    const { page } = tuner;
    await openTab(page, 'Match finder');
    const pi = page.getByTestId('match-candidate').filter({ hasText: 'Pi network, Q = 2: shunt C, series L, shunt C' });
    await pi.getByRole('button', { name: 'Apply Pi network, Q = 2: shunt C, series L, shunt C', exact: true }).click();
    await page.getByText(/Applied Pi network/).waitFor();
    await openTab(page, 'Element');
    await expect.poll(() => chainList(page).getByRole('button').count()).toBe(3);
    await tuner.screenshot('workspace-04-pi-applied');

    // Undo from anywhere outside a text field takes the whole chain replacement back.
    await page.getByRole('heading', { level: 1 }).click();
    await page.keyboard.press('Control+z');
    await expect.poll(() => chainList(page).getByRole('button').allInnerTexts()).toEqual(['C1, shunt C, 1.8 pF', 'L1, series L, 930 pH']);
    await page.keyboard.press('Control+Shift+z');
    await expect.poll(() => chainList(page).getByRole('button').count()).toBe(3);
    await page.getByRole('button', { name: 'Undo', exact: true }).click();
    await expect.poll(() => chainList(page).getByRole('button').count()).toBe(2);
    await summaryWorst(page).getByText('in goal').waitFor();
    tuner.assertClean();
  });

  it('edits the load and the band in forms with errors beside the fields', async () => {
    const { page } = tuner;
    await openTab(page, 'Band & port');
    const band = page.getByRole('form', { name: 'Band, sweep and goal' });
    const stop = band.getByLabel('Stop (Hz)').first();
    await stop.fill('2.3 GHz');
    await band.getByRole('button', { name: 'Apply' }).click();
    await band.getByText('must not be below the band start').waitFor();
    await band.getByRole('button', { name: 'Revert' }).click();
    expect(await stop.inputValue()).toBe('2.4835 GHz');
    await band.getByLabel('VSWR', { exact: true }).fill('1.5');
    await band.getByRole('button', { name: 'Apply' }).click();
    await page.getByTestId('summary-goal').getByText('VSWR ≤ 1.5').waitFor();

    await openTab(page, 'Load');
    const load = page.getByRole('form', { name: 'Load' });
    expect(await load.getByLabel('Load model').inputValue()).toBe('rlc');
    await load.getByLabel('L (H)').fill('3.9 nF');
    await load.getByRole('button', { name: 'Apply load' }).click();
    await load.getByText(/farads.*expected henries/).waitFor();
    await load.getByRole('button', { name: 'Revert' }).click();
    await tuner.screenshot('workspace-05-forms');
    tuner.assertClean();
  });

  it('opens a local .s1p file in the load form and the figures follow the measured load', async () => {
    const { page } = tuner;
    await openTab(page, 'Load');
    const load = page.getByRole('form', { name: 'Load' });
    const worstBefore = await summaryWorst(page).innerText();
    await load.getByLabel('Load model').selectOption('measured');
    await load.getByLabel('Open a .s1p file from this computer').setInputFiles({
      name: 'chip-antenna-remeasured.s1p',
      mimeType: 'text/plain',
      buffer: Buffer.from(remeasuredChipAntenna(), 'utf8'),
    });
    await load.getByText('(chip-antenna-remeasured.s1p)').waitFor();
    expect(await load.getByLabel(/^Touchstone text/).inputValue()).toContain('# GHz S RI R 50');
    await load.getByRole('button', { name: 'Apply load' }).click();
    // The summary is worked out again from the measured data: a different worst-in-band VSWR, never NaN.
    await expect.poll(() => summaryWorst(page).innerText(), { timeout: 15_000 }).not.toBe(worstBefore);
    expect(await summaryWorst(page).innerText()).toMatch(/VSWR\s+\d/);
    expect(await workspace(page).innerText()).not.toMatch(/NaN|Infinity/);
    await tuner.screenshot('workspace-05b-measured-load');
    // Put the model back so the tests after this one see the room they expect.
    await load.getByLabel('Load model').selectOption('rlc');
    await load.getByLabel('R (Ω)').fill('18');
    await load.getByLabel('L (H)').fill('3.9n');
    await load.getByLabel('C (F)').fill('1.3p');
    await load.getByRole('button', { name: 'Apply load' }).click();
    await expect.poll(() => summaryWorst(page).innerText(), { timeout: 15_000 }).toBe(worstBefore);
    tuner.assertClean();
  });

  it('on the chain canvas: a click selects, dragging the value or the wheel tunes, dragging a part reorders', async () => {
    const { page } = tuner;
    await openTab(page, 'Element');
    await page.getByLabel('Tuning steps').selectOption('smooth');
    const canvas = page.locator('.chain-canvas canvas').first();
    const raw = (await canvas.boundingBox())!;
    const box = { ...raw, x: Math.round(raw.x), y: Math.round(raw.y) };
    const layout = chainLayout(2);
    const left = box.x + Math.max(0, Math.floor((box.width - layout.width) / 2));
    const centreOf = (index: number) => left + layout.cellX(index) + 60;
    const valueOf = async () => inspector(page).getByLabel('Value (H)', { exact: true }).inputValue();

    // L1 sits next to the load (chain index 0, on the right).
    await page.mouse.click(centreOf(0), box.y + RAIL_Y + 40);
    await inspector(page).getByRole('heading', { name: /^L1/ }).waitFor();
    expect(await valueOf()).toBe('930 pH');

    // Drag the value label up by 20 px: five 2 % steps.
    await page.mouse.move(centreOf(0), box.y + 32);
    await page.mouse.down();
    await page.mouse.move(centreOf(0), box.y + 22, { steps: 3 });
    await page.mouse.move(centreOf(0), box.y + 12, { steps: 3 });
    await page.mouse.up();
    await expect.poll(valueOf).toBe('1.027 nH'); // 930 pH × 1.02^5
    // One wheel notch down over the part: one step back.
    await page.mouse.move(centreOf(0), box.y + RAIL_Y + 40);
    await page.mouse.wheel(0, 100);
    await expect.poll(valueOf).toBe('1.007 nH');
    await tuner.screenshot('workspace-06-canvas-tuned');
    for (let i = 0; i < 4 && (await valueOf()) !== '930 pH'; i++) await page.getByRole('button', { name: 'Undo', exact: true }).click();
    expect(await valueOf()).toBe('930 pH');

    // Drag C1 (port side, index 1) one cell toward the load: the chain order flips, in one undoable edit.
    await page.mouse.move(centreOf(1), box.y + RAIL_Y + 60);
    await page.mouse.down();
    await page.mouse.move(centreOf(1) + 60, box.y + RAIL_Y + 60, { steps: 5 });
    await page.mouse.move(centreOf(1) + 120, box.y + RAIL_Y + 60, { steps: 5 });
    await page.mouse.up();
    await expect.poll(() => chainList(page).getByRole('button').allInnerTexts()).toEqual(['L1, series L, 930 pH', 'C1, shunt C, 1.8 pF']);
    await summaryWorst(page).getByText('outside goal').waitFor();
    await page.getByRole('button', { name: 'Undo', exact: true }).click();
    await expect.poll(() => chainList(page).getByRole('button').allInnerTexts()).toEqual(['C1, shunt C, 1.8 pF', 'L1, series L, 930 pH']);
    tuner.assertClean();
  });
});

/**
 * An invented "re-measured" chip antenna: the demo series RLC (L 3.9 nH, C 1.3 pF) with R raised
 * from 18 to 30 Ω, as Touchstone RI data from 1.9 to 3.0 GHz. Z = R + j(ωL − 1/(ωC)) and
 * Γ = (Z − 50)/(Z + 50) (common practice).
 */
function remeasuredChipAntenna(): string {
  const lines = ['! invented re-measurement of the demo chip antenna', '# GHz S RI R 50'];
  for (let i = 0; i <= 110; i++) {
    const f = 1.9e9 + i * 10e6;
    const w = 2 * Math.PI * f;
    const re = 30;
    const im = w * 3.9e-9 - 1 / (w * 1.3e-12);
    const den = (re + 50) ** 2 + im ** 2;
    const gRe = ((re - 50) * (re + 50) + im * im) / den;
    const gIm = (im * (re + 50) - (re - 50) * im) / den;
    lines.push(`${(f / 1e9).toFixed(3)} ${gRe.toFixed(6)} ${gIm.toFixed(6)}`);
  }
  return lines.join('\n') + '\n';
}
