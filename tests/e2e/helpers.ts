import { expect, type Page } from '@playwright/test';

export const demoPassword = process.env.NOOKPASS_DEMO_PASSWORD || 'demo-password';

export async function signInAs(page: Page, email: string, password = demoPassword) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByTestId('shell-user')).toBeVisible();
}
