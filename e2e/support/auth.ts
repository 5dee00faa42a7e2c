/**
 * Signing up and in through the real pages, for any browser test. Each helper waits until the app
 * has moved on (the URL changed), so the next step starts from a settled page.
 */
import type { Page } from 'playwright-core';

export interface Account {
  displayName: string;
  email: string;
  password: string;
}

let counter = 0;

/** A fresh account whose e-mail no other test uses. */
export function newAccount(name: string): Account {
  counter += 1;
  const tag = `${Date.now().toString(36)}-${process.pid}-${counter}`;
  return { displayName: name, email: `${name.toLowerCase().replace(/[^a-z0-9]+/g, '-')}-${tag}@example.test`, password: 'woven-arcs-2441' };
}

const signInForm = (page: Page) => page.getByRole('form', { name: 'Sign in' });
const signUpForm = (page: Page) => page.getByRole('form', { name: 'Create an account' });

export async function fillSignUp(page: Page, account: Account): Promise<void> {
  const form = signUpForm(page);
  await form.getByLabel('Your name', { exact: true }).fill(account.displayName);
  await form.getByLabel('E-mail', { exact: true }).fill(account.email);
  await form.getByLabel('Password', { exact: true }).fill(account.password);
}

/** Opens the sign-up page, creates the account and waits to leave the page. */
export async function signUp(page: Page, account: Account): Promise<void> {
  await page.goto('/sign-up');
  await fillSignUp(page, account);
  await signUpForm(page).getByRole('button', { name: 'Create account' }).click();
  await page.waitForURL((url) => url.pathname !== '/sign-up');
}

/** Fills and sends the sign-in form on the current page, then waits to leave it. */
export async function submitSignIn(page: Page, email: string, password: string): Promise<void> {
  const form = signInForm(page);
  await form.getByLabel('E-mail', { exact: true }).fill(email);
  await form.getByLabel('Password', { exact: true }).fill(password);
  await form.getByRole('button', { name: 'Sign in', exact: true }).click();
  await page.waitForURL((url) => url.pathname !== '/sign-in');
}

export async function signIn(page: Page, email: string, password: string): Promise<void> {
  await page.goto('/sign-in');
  await submitSignIn(page, email, password);
}

/** Signs out from the app bar and waits for the sign-in page. */
export async function signOut(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL((url) => url.pathname === '/sign-in');
}
