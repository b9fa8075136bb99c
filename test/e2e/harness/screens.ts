// The shell's screens and displays, for tests that visit all of them.
import type { Page } from 'playwright-core';

/** The nav buttons of the shell, one per screen (src/app/App.tsx). */
export const SCREEN_BUTTONS = ['Watch log', 'Ice map', 'Review', 'Exchange', 'Settings'] as const;
export type ScreenButton = (typeof SCREEN_BUTTONS)[number];

/** The manual display themes (the `auto` mode picks one of these). */
export const THEMES = ['day', 'night', 'red'] as const;

/** Switches to a screen through its nav button and waits until the shell marks it current. */
export async function showScreen(page: Page, name: ScreenButton): Promise<void> {
  const button = page.getByRole('navigation', { name: 'Screens' }).getByRole('button', { name, exact: true });
  await button.click();
  await page.waitForFunction(
    (label) => [...document.querySelectorAll('nav[aria-label="Screens"] button')].some((b) => b.textContent === label && b.getAttribute('aria-current') === 'page'),
    name,
  );
  // The screen's own heading is inside <main>; wait for it so the screen has rendered.
  await page.locator('main h2').first().waitFor();
}

/** Selects a display theme and waits until the document carries it. */
export async function setTheme(page: Page, theme: (typeof THEMES)[number]): Promise<void> {
  await page.getByLabel('Display theme').selectOption(theme);
  await page.waitForFunction((t) => document.documentElement.dataset.theme === t, theme);
}
