import type { Locator, Page } from 'playwright-core';

/** The panel of the benchmark page under a heading. */
export function panel(page: Page, heading: RegExp): Locator {
  return page.locator('section', { has: page.getByRole('heading', { name: heading }) }).first();
}

/**
 * Saves the view of a benchmark panel to a deck through its "Add to deck" dialog:
 * to the deck `deckId`, or to a new deck titled `newTitle`. Returns the deck id.
 */
export async function addViewToDeck(page: Page, section: Locator, kind: string, target: { deckId: string } | { newTitle: string }): Promise<string> {
  await section.getByRole('button', { name: 'Add to deck' }).first().click();
  const dialog = page.getByRole('dialog', { name: 'Add this view to a deck' });
  const deckSelect = dialog.getByRole('combobox', { name: 'Deck' });
  await deckSelect.waitFor();
  if ('deckId' in target) await deckSelect.selectOption(target.deckId);
  else {
    await deckSelect.selectOption('');
    await dialog.getByLabel('New deck title').fill(target.newTitle);
  }
  await dialog.getByRole('combobox', { name: 'View' }).selectOption(kind);
  await dialog.getByLabel('Note').fill(`Saved from the ${kind} view`);
  await dialog.getByRole('button', { name: 'Add view' }).click();
  const open = dialog.getByRole('link', { name: 'Open the deck' });
  await open.waitFor();
  const id = (await open.getAttribute('href'))!.split('/').pop()!;
  await dialog.getByRole('button', { name: 'Close' }).click();
  return id;
}
