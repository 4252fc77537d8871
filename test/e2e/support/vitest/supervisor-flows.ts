// The supervisor's steps the yard-server browser tests share: signing in through the page, as a person would, so
// that the session cookie is the browser's own and every later page is requested with it.
import type { Page } from 'playwright-core';
import { SUPERVISOR } from './yard-server.js';

/** Signs in on the login page and waits for the review queue it lands on. */
export async function signInAsSupervisor(page: Page, origin: string): Promise<void> {
  await page.goto(`${origin}/supervisor/login`);
  await page.getByLabel('Name').fill(SUPERVISOR.username);
  await page.getByLabel('Password').fill(SUPERVISOR.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('heading', { level: 1, name: 'Review queue' }).waitFor();
}
