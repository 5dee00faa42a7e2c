// @vitest-environment jsdom
import { cleanup, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { SignUpForm } from '../../client/features/auth/components/sign-up-form';
import { answerWith, renderApp } from './support/render';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

async function fill({ name = 'Rhea Okafor', email = 'rhea@example.test', password = 'woven-arcs-2441' } = {}) {
  await userEvent.type(screen.getByLabelText('Your name'), name);
  await userEvent.type(screen.getByLabelText('E-mail'), email);
  await userEvent.type(screen.getByLabelText('Password'), password);
  await userEvent.click(screen.getByRole('button', { name: 'Create account' }));
}

describe('SignUpForm', () => {
  it('checks the password length before asking the server', async () => {
    const server = answerWith();
    renderApp(<SignUpForm onSuccess={() => undefined} />);
    await fill({ password: 'short' });
    expect(await screen.findByText('Use at least 10 characters')).toBeTruthy();
    expect(screen.getByLabelText('Password').getAttribute('aria-invalid')).toBe('true');
    expect(server.requests).toHaveLength(0);
  });

  it('puts the server’s field message beside the field it names', async () => {
    answerWith({ status: 400, body: { error: { code: 'invalid-input', message: 'displayName: must be at most 80 characters', field: 'displayName' } } });
    renderApp(<SignUpForm onSuccess={() => undefined} />);
    await fill();
    const name = screen.getByLabelText('Your name');
    const message = await screen.findByText('must be at most 80 characters');
    expect(name.getAttribute('aria-invalid')).toBe('true');
    expect(name.getAttribute('aria-describedby')).toBe(message.id);
    expect(screen.queryByRole('alert')).toBeNull();
  });

  it('shows an address already in use beside the e-mail field', async () => {
    const taken = 'That e-mail address cannot be used to sign up. Sign in instead if it is yours.';
    answerWith({ status: 409, body: { error: { code: 'email-taken', message: taken } } });
    const onSuccess = vi.fn();
    renderApp(<SignUpForm onSuccess={onSuccess} />);
    await fill({ email: 'owner@demo.test' });
    const message = await screen.findByText(taken);
    expect(screen.getByLabelText('E-mail').getAttribute('aria-describedby')).toBe(message.id);
    expect(onSuccess).not.toHaveBeenCalled();
  });

  it('shows an error that belongs to no field above the form', async () => {
    answerWith({ status: 500, body: { error: { code: 'internal', message: 'Something went wrong on the server.' } } });
    renderApp(<SignUpForm onSuccess={() => undefined} />);
    await fill();
    expect((await screen.findByRole('alert')).textContent).toBe('Something went wrong on the server.');
  });

  it('sends the three fields and reports success', async () => {
    const server = answerWith({ status: 201, body: { id: 'u9', email: 'rhea@example.test', displayName: 'Rhea Okafor' } });
    const onSuccess = vi.fn();
    renderApp(<SignUpForm onSuccess={onSuccess} />);
    await fill();
    await waitFor(() => expect(onSuccess).toHaveBeenCalledTimes(1));
    expect(server.requests[0]).toEqual({
      method: 'POST',
      url: '/api/auth/signup',
      body: { displayName: 'Rhea Okafor', email: 'rhea@example.test', password: 'woven-arcs-2441' },
    });
  });
});
