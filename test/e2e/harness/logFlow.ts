// Steps through the real screens that several reliability tests share: create a cruise from the
// watch log's start screen, log one observation, export the log. Labels are the app's own.
import type { Page } from 'playwright-core';
import { pagePoint, screenPoint, waitForIdle } from '../map/mapPage';
import { showScreen } from './screens';

export interface CruiseInput {
  name: string;
  vessel: string;
  observers: Array<{ name: string; initials: string }>;
}

/** From the watch log's start screen: "New cruise", fill the editor, create it. */
export async function createCruise(page: Page, cruise: CruiseInput): Promise<void> {
  await showScreen(page, 'Watch log');
  await page.getByRole('button', { name: 'New cruise' }).click();
  const form = page.getByRole('form', { name: 'New cruise' });
  await form.getByLabel('Cruise name').fill(cruise.name);
  await form.getByLabel('Vessel', { exact: true }).fill(cruise.vessel);
  for (let i = 0; i < cruise.observers.length; i++) {
    const o = cruise.observers[i] as { name: string; initials: string };
    if ((await form.getByLabel(`Observer ${i + 1} name`).count()) === 0) await form.getByRole('button', { name: 'Add an observer' }).click();
    await form.getByLabel(`Observer ${i + 1} name`).fill(o.name);
    await form.getByLabel('Initials').nth(i).fill(o.initials);
  }
  await form.getByRole('button', { name: 'Create the cruise' }).click();
  await page.locator('form.observation-form').waitFor({ timeout: 30_000 });
}

export interface ObservationInput {
  /** UTC time as typed ("YYYY-MM-DD HH:MM"); empty for now. */
  time?: string;
  /** Position typed by hand, in any format the domain reads. */
  position: string;
  /** Total concentration in tenths, as typed (e.g. "9"). */
  total: string;
  notes: string;
}

/** Fills the new-observation form (typed position, total concentration, notes) and saves it. */
export async function logObservation(page: Page, obs: ObservationInput): Promise<string> {
  const form = page.locator('form.observation-form');
  if (obs.time) await form.locator('#f-time').fill(obs.time);
  await form.locator('#f-position-source').selectOption('manual');
  await form.locator('#f-position').fill(obs.position);
  await form.locator('#f-total').fill(obs.total);
  await form.locator('#f-notes').fill(obs.notes);
  const status = form.locator('.save-status');
  const before = await status.innerText();
  await form.getByRole('button', { name: /Save the observation/ }).click();
  // Each observation has its own time, so a new save always changes the line.
  await page.waitForFunction(
    (prev) => {
      const s = document.querySelector('form.observation-form .save-status');
      const t = (s?.textContent ?? '').trim();
      return t !== '' && t !== prev.trim();
    },
    before,
    { timeout: 30_000 },
  );
  return status.innerText();
}

/**
 * On the Ice map (the app must have been opened with `?map-debug`), clicks the observation drawn
 * at a position and returns the text of its details panel, or null when nothing was selected.
 */
export async function detailsOnMap(page: Page, lon: number, lat: number): Promise<{ notes: string | null; all: string } | null> {
  await showScreen(page, 'Ice map');
  const details = page.getByTestId('map-details');
  // The map may still be framing the cruise when it first turns idle: then aim again.
  for (let attempt = 0; ; attempt++) {
    await waitForIdle(page);
    // The debug hook projects into the map's own pixels; the mouse needs page pixels.
    const p = await pagePoint(page, await screenPoint(page, lon, lat));
    const view = page.viewportSize();
    if (view && (p.y < 0 || p.y >= view.height || p.x < 0 || p.x >= view.width)) {
      // Scroll the page so the point is on screen, then aim again.
      if (attempt > 4) return null;
      await page.evaluate((dy) => window.scrollBy(0, dy), p.y - view.height / 2);
      await page.waitForTimeout(200);
      continue;
    }
    await page.mouse.click(p.x, p.y);
    try {
      await details.waitFor({ timeout: 3_000 });
      break;
    } catch {
      if (attempt === 2) return null;
    }
  }
  const notes = details.locator('dd.notes');
  return { notes: (await notes.count()) > 0 ? await notes.innerText() : null, all: await details.innerText() };
}
