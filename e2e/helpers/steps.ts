/** Steps several end-to-end tests take the same way. */
import { expect, type Locator, type Page } from '@playwright/test';

/** Step the interval control up from its shortest end, one arrow key at a time, to an interval of hours or days. */
export async function stepToHoursOrDays(slider: Locator): Promise<void> {
  await slider.focus();
  await slider.page().keyboard.press('Home');
  for (let i = 0; i < 40; i++) {
    const text = (await slider.getAttribute('aria-valuetext')) ?? '';
    if (/\b(h|day|days)\b/.test(text)) break;
    await slider.page().keyboard.press('ArrowRight');
  }
}

/** Hold a variable from the Intervene pane; returns the hold form (it lists what is held). */
export async function holdFromPane(page: Page, label: string, value: string): Promise<Locator> {
  await page.getByRole('tab', { name: 'Intervene' }).click();
  const holdForm = page.locator('.lf-hold');
  await holdForm.getByRole('combobox').selectOption({ label });
  await holdForm.getByRole('textbox').fill(value);
  await holdForm.getByRole('button', { name: 'Hold', exact: true }).click();
  await expect(holdForm).toContainText(`${label} = ${value}`);
  return holdForm;
}
