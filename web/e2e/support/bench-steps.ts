import type { Page } from 'playwright-core';
import { passingCheck } from '../../../api/src/testing/bench-fixtures';

/**
 * Steps a lab takes on the Lab bench round page that several browser stories share. Each step
 * waits for what the page shows afterwards.
 */

/**
 * Records a passing instrument check of `instrument` (common practice values: 92 nm latex, three
 * runs within 3 nm, PDI ≤ 0.025; api/src/testing/bench-fixtures passingCheck) and waits until the
 * check history shows it.
 */
export async function recordPassingCheck(page: Page, instrument: string): Promise<void> {
  const check = passingCheck(instrument);
  await page.getByTestId('check-instrument').fill(check.instrument);
  await page.getByLabel('Reference material').fill(check.material);
  await page.getByLabel('Reference (nm)').fill(String(check.referenceValueNm));
  await page.getByLabel('Tolerance (± nm)').fill(String(check.toleranceNm));
  await page.getByLabel('PDI limit').fill(String(check.pdiLimit));
  await page.getByLabel('Min. equilibration (min)').fill(String(check.minEquilibrationMin));
  for (const [k, run] of check.runs.entries()) {
    await page.getByLabel(`Check replicate ${k + 1} Z-average (nm)`).fill(String(run.zAverageNm));
    await page.getByLabel(`Check replicate ${k + 1} PDI`).fill(String(run.pdi));
    await page
      .getByLabel(`Check replicate ${k + 1} temperature (°C)`)
      .fill(String(run.temperatureC));
    await page
      .getByLabel(`Check replicate ${k + 1} equilibration (min)`)
      .fill(String(run.equilibrationMin));
  }
  await page.getByTestId('check-preview').filter({ hasText: 'Pass:' }).waitFor();
  await page.getByTestId('record-check').click();
  await page.getByTestId('check-history').getByText('● Pass').waitFor();
}
