import { describe, expect, it } from 'vitest';
import { screenshot } from './support/browser';
import { useJourneys } from './support/journey';

describe('the start page in Chromium', () => {
  const journeys = useJourneys();

  it('renders in the shipped Atkinson Hyperlegible font with no console errors', async () => {
    const { page, baseUrl } = journeys.start();
    const errors: string[] = [];
    page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(baseUrl + '/');
    await page.getByRole('heading', { level: 1 }).waitFor();
    const fontLoaded = await page.evaluate(async () => {
      await document.fonts.ready;
      return (
        document.fonts.check('16px "Atkinson Hyperlegible"') &&
        [...document.fonts].some((f) => f.family.includes('Atkinson') && f.status === 'loaded')
      );
    });
    expect(fontLoaded).toBe(true);
    await screenshot(page, 'home-1280');
    expect(errors).toEqual([]);
  });

  it('serves unknown paths with the app and its not-found page', async () => {
    const { page, baseUrl } = journeys.start();
    await page.goto(baseUrl + '/nowhere/at/all');
    await page.getByRole('heading', { name: 'Page not found' }).waitFor();
  });
});
