import AxeBuilder from '@axe-core/playwright';
import { expect, request as playwrightRequest, type APIRequestContext, type Page } from '@playwright/test';
import { demoUsers, type DemoUser } from '../../seed/demo';
import type { Role } from '../../src/lib/roles';

export const baseURL = `http://127.0.0.1:${process.env.E2E_PORT ?? 3100}`;

export function demo(role: Role): DemoUser {
	return demoUsers.find((u) => u.role === role)!;
}

/** An HTTP client signed in as this person (form post with a same-site Origin, as a browser sends). */
export async function signedInClient(who: { email: string; password: string }): Promise<APIRequestContext> {
	const ctx = await playwrightRequest.newContext({ baseURL, extraHTTPHeaders: { origin: baseURL } });
	const res = await ctx.post('/signin', { form: { email: who.email, password: who.password }, headers: { accept: 'text/html' }, maxRedirects: 0 });
	expect(res.status(), `sign-in of ${who.email}`).toBe(303);
	return ctx;
}

export async function anonymousClient(): Promise<APIRequestContext> {
	return playwrightRequest.newContext({ baseURL, extraHTTPHeaders: { origin: baseURL } });
}

export async function signIn(page: Page, who: { email: string; password: string }) {
	await page.goto('/signin');
	await page.getByLabel('E-mail address').fill(who.email);
	await page.getByLabel('Password').fill(who.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/overview$/);
}

/** axe-core on the current page: no serious or critical violations. */
export async function expectAccessible(page: Page) {
	const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
	const bad = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
	expect(bad.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`)).toEqual([]);
}
