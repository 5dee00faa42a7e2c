// @vitest-environment jsdom
import { cleanup, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { SignInForm } from '../../client/features/auth/components/sign-in-form';
import { answerWith, renderApp } from './support/render';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const demoUser = { id: 'u1', email: 'owner@demo.test', displayName: 'Demo Owner' };

describe('SignInForm', () => {
  it('shows what is missing beside each field and sends nothing', async () => {
    const server = answerWith();
    const onSuccess = vi.fn();
    renderApp(<SignInForm onSuccess={onSuccess} />);
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));

    const email = screen.getByLabelText('E-mail');
    expect(await screen.findByText('Enter your e-mail address')).toBeTruthy();
    expect(screen.getByText('Enter your password')).toBeTruthy();
    expect(email.getAttribute('aria-invalid')).toBe('true');
    // The message is tied to its field for screen readers.
    expect(email.getAttribute('aria-describedby')).toBe(screen.getByText('Enter your e-mail address').id);
    expect(server.requests).toHaveLength(0);
    expect(onSuccess).not.toHaveBeenCalled();
  });

  it('shows the server’s refusal as a message about the whole form', async () => {
    const server = answerWith({ status: 401, body: { error: { code: 'bad-credentials', message: 'The e-mail address or password is not right.' } } });
    const onSuccess = vi.fn();
    renderApp(<SignInForm onSuccess={onSuccess} />);
    await userEvent.type(screen.getByLabelText('E-mail'), 'owner@demo.test');
    await userEvent.type(screen.getByLabelText('Password'), 'not-the-password');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));

    expect((await screen.findByRole('alert')).textContent).toBe('The e-mail address or password is not right.');
    expect(server.requests).toEqual([
      { method: 'POST', url: '/api/auth/signin', body: { email: 'owner@demo.test', password: 'not-the-password' } },
    ]);
    expect(onSuccess).not.toHaveBeenCalled();
  });

  it('signs in and reports success', async () => {
    answerWith({ status: 200, body: demoUser });
    const onSuccess = vi.fn();
    renderApp(<SignInForm onSuccess={onSuccess} />);
    await userEvent.type(screen.getByLabelText('E-mail'), 'owner@demo.test');
    await userEvent.type(screen.getByLabelText('Password'), 'matchloom-demo');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(onSuccess).toHaveBeenCalledTimes(1));
    expect(screen.queryByRole('alert')).toBeNull();
  });

  it('fills the form from a listed demo account', async () => {
    answerWith();
    renderApp(<SignInForm onSuccess={() => undefined} showDemoAccounts />);
    await userEvent.click(screen.getByRole('button', { name: 'Use the demo tuner account, tuner@demo.test' }));
    expect((screen.getByLabelText('E-mail') as HTMLInputElement).value).toBe('tuner@demo.test');
    expect((screen.getByLabelText('Password') as HTMLInputElement).value).toBe('matchloom-demo');
  });

  it('lists no demo accounts unless asked to', () => {
    answerWith();
    renderApp(<SignInForm onSuccess={() => undefined} />);
    expect(screen.queryByRole('region', { name: 'Demo accounts' })).toBeNull();
    expect(screen.queryByText('owner@demo.test')).toBeNull();
  });
});
