import path from 'node:path';
import { type Page } from 'playwright-core';
import { BASE_URL, firaSansApplied, SCREENSHOT_DIR, signIn, signInToHome, openPagePerTest } from './browser';
import { DEMO_PASSWORD, DEMO_USERS, demoUser } from './demo-users';

let page: Page;

openPagePerTest((p) => {
  page = p;
});

describe(`Kerfwright in Chromium at ${BASE_URL}`, () => {
  it.each(DEMO_USERS.map((u) => [u.role, u.email] as const))(
    'signs the %s in through the form and shows their home page in Fira Sans',
    async (role, email) => {
      await signInToHome(page, email, DEMO_PASSWORD);
      const home = page.getByTestId(`home-${role}`);
      await home.waitFor({ state: 'visible' });
      expect(new URL(page.url()).pathname).toBe('/');

      const heading = home.getByRole('heading', { level: 1 });
      expect(await heading.textContent()).toMatch(/home$/i);
      await page
        .getByTestId('service-health')
        .getByText(/Version/)
        .waitFor();

      // Fira Sans is shipped with the app (@fontsource): a face must have loaded, not just be named.
      const font = await firaSansApplied(page, `[data-testid="home-${role}"] h1`);
      expect(font.loaded).toBe(true);
      expect(font.family.replace(/["']/g, '')).toMatch(/^Fira Sans/);
      const bodyFont = await firaSansApplied(page, 'body');
      expect(bodyFont.family.replace(/["']/g, '')).toMatch(/^Fira Sans/);

      await page.screenshot({ path: path.join(SCREENSHOT_DIR, `home-${role}.png`), fullPage: true });
    },
  );

  it('refuses a wrong password with a message and stays on sign-in', async () => {
    await signIn(page, demoUser('operator').email, 'not-the-demo-password');
    const alert = page.getByTestId('form-error');
    await alert.waitFor({ state: 'visible' });
    expect((await alert.textContent())?.trim().length).toBeGreaterThan(0);
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    expect(await page.evaluate(() => window.localStorage.getItem('kerfwright.accessToken'))).toBeNull();
  });

  it('shows People to the supervisor, with the people list', async () => {
    await signInToHome(page, demoUser('supervisor').email, DEMO_PASSWORD);
    await page.getByTestId('home-supervisor').waitFor();
    const nav = page.getByRole('navigation', { name: 'Main' });
    await nav.getByRole('link', { name: 'People' }).click();
    await page.getByRole('heading', { level: 1, name: 'People' }).waitFor();
    await page.getByTestId(`person-${demoUser('hobbyist').email}`).waitFor();
    expect(new URL(page.url()).pathname).toBe('/people');
  });

  it('does not offer People to a hobbyist, and refuses it if typed in', async () => {
    await signInToHome(page, demoUser('hobbyist').email, DEMO_PASSWORD);
    await page.getByTestId('home-hobbyist').waitFor();
    const nav = page.getByRole('navigation', { name: 'Main' });
    expect(await nav.getByRole('link').allTextContents()).toEqual(['Home', 'Designs', 'Jobs', 'Safety']);

    await page.goto('/people');
    await page.getByText('This page is not part of your role').waitFor();
  });

  it('registers a new member as a hobbyist; the supervisor deactivates them and they can no longer sign in', async () => {
    // A fresh address each run, so the test also passes against a database it has run against before.
    const email = `new-member-${Date.now()}@millbrook-makerspace.example`;
    const password = 'a-new-members-passphrase';
    await page.goto('/register');
    await page.getByRole('textbox', { name: /Your name/ }).fill('Nova Member');
    await page.getByRole('textbox', { name: /E-mail/ }).fill(email);
    await page.getByLabel(/^Password/).fill(password);
    await page.getByLabel(/^Repeat password/).fill(password);
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByTestId('home-hobbyist').waitFor();
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();

    await signInToHome(page, demoUser('supervisor').email, DEMO_PASSWORD);
    await page.goto(`/people?q=${encodeURIComponent(email)}`);
    const row = page.getByTestId(`person-${email}`);
    await row.waitFor();
    await row.getByRole('button', { name: 'Deactivate Nova Member' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Deactivate' }).click();
    await row.getByText('Deactivated').waitFor();
    await page.getByRole('button', { name: 'Sign out' }).click();

    await signIn(page, email, password);
    await page.getByTestId('form-error').waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in');
  });

  it('shows the 404 page for an unknown address', async () => {
    await page.goto('/no-such-page/here');
    await page.getByRole('heading', { name: 'Page not found' }).waitFor();
    expect(await page.getByTestId('not-found').textContent()).toContain('/no-such-page/here');
  });

  it('signs out back to the sign-in page, and the session is gone', async () => {
    await signInToHome(page, demoUser('fabricator').email, DEMO_PASSWORD);
    await page.getByTestId('home-fabricator').waitFor();
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    expect(await page.evaluate(() => window.localStorage.getItem('kerfwright.accessToken'))).toBeNull();

    await page.goto('/');
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in');
  });
});
