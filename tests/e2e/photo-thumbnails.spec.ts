import AxeBuilder from '@axe-core/playwright';
import { expect, test } from '@playwright/test';
import { signInAs } from './helpers';

/*
 * Thumbnails are made by a job after the upload answers: the project page shows the state where the
 * thumbnail will be, swaps in the image once it is made, and offers "Make again" after the last attempt failed.
 */

// WCAG 2.2 level AA, as axe-core tags its rules.
const WCAG_22_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];

test('the project page shows a thumbnail’s state until it is made, and a damaged photo can be made again', async ({ page }) => {
  test.setTimeout(120_000);
  await signInAs(page, 'installer2@nookpass.demo');
  const project = await page.request.post('/api/projects', { data: { name: `E2E thumbnails ${Date.now()} (test)`, siteAddress: '6 Thumbnail Street', jurisdiction: 'demo-county' } });
  const { id } = (await project.json()) as { id: string };

  const sharp = (await import('sharp')).default;
  const good = await sharp({ create: { width: 1200, height: 900, channels: 3, background: { r: 90, g: 130, b: 170 } } }).png().toBuffer();
  // The header reads, the pixels stop a third of the way in: the upload takes it, the job cannot decode it.
  const whole = await sharp({ create: { width: 800, height: 600, channels: 3, background: '#808080', noise: { type: 'gaussian', mean: 128, sigma: 40 } } }).jpeg().toBuffer();
  const damaged = whole.subarray(0, Math.floor(whole.length / 3));
  for (const [name, buffer, mimeType, caption] of [['closet.png', good, 'image/png', 'closet (test)'], ['damaged.jpg', damaged, 'image/jpeg', 'damaged (test)']] as const) {
    const res = await page.request.post(`/api/projects/${id}/attachments`, { multipart: { file: { name, mimeType, buffer }, caption } });
    expect(res.status()).toBe(201);
  }

  await page.goto(`/projects/${id}`);
  // The good photo's thumbnail replaces its state once the job has made it (the list is read again meanwhile).
  await expect(page.getByRole('img', { name: 'closet (test)' })).toBeVisible({ timeout: 60_000 });
  const state = page.getByTestId('thumbnail-state');
  await expect(state).toHaveCount(1);
  // NOOKPASS_DERIVATIVE_ATTEMPTS is 4 in the served test app.
  await expect(state).toContainText('Photo: thumbnail not made after 4 attempts', { timeout: 60_000 });
  await expect(state).toContainText('The image could not be read; it may be damaged.');
  for (const size of [{ width: 1280, height: 900 }, { width: 390, height: 844 }]) {
    await page.setViewportSize(size);
    const axe = await new AxeBuilder({ page }).withTags(WCAG_22_AA).analyze();
    expect(axe.violations, JSON.stringify(axe.violations.map((v) => v.id))).toEqual([]);
  }

  await page.getByRole('button', { name: 'Make the thumbnail of damaged.jpg again' }).click();
  await expect(state).not.toHaveAttribute('data-derivatives-status', 'failed');
  await expect(state).toContainText(/thumbnail (queued|being made|failed, retrying)/);
  // Still damaged: it ends failed again, and may be asked for again.
  await expect(state).toHaveAttribute('data-derivatives-status', 'failed', { timeout: 60_000 });
  await expect(page.getByRole('button', { name: 'Make the thumbnail of damaged.jpg again' })).toBeVisible();
});
