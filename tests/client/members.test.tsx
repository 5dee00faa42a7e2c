// @vitest-environment jsdom
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { AddMemberForm } from '../../client/features/members/components/add-member-form';
import { MemberList } from '../../client/features/members/components/member-list';
import type { Member } from '../../client/features/members/api/member';
import { notices } from '../../client/lib/notices';
import { answerWith, renderApp } from './support/render';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  notices.clear();
});

const members: Member[] = [
  { userId: 'u-owner', email: 'rhea@example.test', displayName: 'Rhea Okafor', role: 'owner' },
  { userId: 'u-tuner', email: 'tomas@example.test', displayName: 'Tomas Lind', role: 'tuner' },
];

describe('MemberList', () => {
  it('gives an observer (or tuner) a plain list with no control at all', () => {
    answerWith();
    const { container } = renderApp(<MemberList roomId="r1" members={members} currentUserId="u-tuner" canManage={false} />);
    expect(container.querySelectorAll('button, select, input, textarea')).toHaveLength(0);
    const list = screen.getByRole('list', { name: 'Members' });
    expect(within(list).getAllByRole('listitem')).toHaveLength(2);
    expect(within(list).getByText('(you)').closest('li')?.textContent).toContain('Tomas Lind');
  });

  it('gives the owner a role menu and a remove button for everyone but themself, and sends the change', async () => {
    const server = answerWith({ status: 200, body: { ...members[1], role: 'observer' } }, { status: 200, body: members });
    renderApp(<MemberList roomId="r1" members={members} currentUserId="u-owner" canManage />);
    expect(screen.getAllByRole('combobox')).toHaveLength(1);
    const menu = screen.getByLabelText('Role of Tomas Lind');
    await userEvent.selectOptions(menu, 'observer');
    await waitFor(() => expect(server.requests[0]).toEqual({ method: 'PATCH', url: '/api/rooms/r1/members/u-tuner', body: { role: 'observer' } }));

    // Removing asks once more before it sends anything.
    await userEvent.click(screen.getByRole('button', { name: 'Remove Tomas Lind from the room' }));
    expect(server.requests).toHaveLength(1);
    expect(screen.getByRole('button', { name: 'Remove Tomas Lind' })).toBeTruthy();
    await userEvent.click(screen.getByRole('button', { name: 'Keep' }));
    expect(screen.queryByRole('button', { name: 'Remove Tomas Lind' })).toBeNull();
  });

  it('announces a refused role change in the notice area', async () => {
    answerWith({ status: 409, body: { error: { code: 'last-owner', message: 'A room needs at least one owner: make someone else an owner first.' } } });
    const { store } = renderApp(
      <MemberList roomId="r1" members={[members[0], { ...members[1], role: 'owner' }]} currentUserId="u-tuner" canManage />,
    );
    await userEvent.selectOptions(screen.getByLabelText('Role of Rhea Okafor'), 'tuner');
    await waitFor(() => expect(store.list().map((n) => n.message)).toEqual(['A room needs at least one owner: make someone else an owner first.']));
  });
});

describe('AddMemberForm', () => {
  it('shows "already a member" beside the e-mail field', async () => {
    const server = answerWith({ status: 409, body: { error: { code: 'already-member', message: 'That user is already a member of this room.' } } });
    renderApp(<AddMemberForm roomId="r1" />);
    await userEvent.type(screen.getByLabelText('E-mail'), 'tomas@example.test');
    await userEvent.selectOptions(screen.getByLabelText('Role'), 'observer');
    await userEvent.click(screen.getByRole('button', { name: 'Add member' }));
    const message = await screen.findByText('That user is already a member of this room.');
    expect(screen.getByLabelText('E-mail').getAttribute('aria-describedby')).toBe(message.id);
    expect(server.requests[0]).toEqual({ method: 'POST', url: '/api/rooms/r1/members', body: { email: 'tomas@example.test', role: 'observer' } });
  });

  it('refuses a malformed address without asking the server', async () => {
    const server = answerWith();
    renderApp(<AddMemberForm roomId="r1" />);
    await userEvent.type(screen.getByLabelText('E-mail'), 'not-an-address');
    await userEvent.click(screen.getByRole('button', { name: 'Add member' }));
    expect(await screen.findByText('Enter a valid e-mail address')).toBeTruthy();
    expect(server.requests).toHaveLength(0);
  });

  it('says when an address without an account was invited instead', async () => {
    answerWith(
      { status: 202, body: { invited: true, id: 'i1', email: 'new@example.test', role: 'tuner', expiresAt: 1 } },
      { status: 200, body: members },
    );
    renderApp(<AddMemberForm roomId="r1" />);
    await userEvent.type(screen.getByLabelText('E-mail'), 'new@example.test');
    await userEvent.click(screen.getByRole('button', { name: 'Add member' }));
    await waitFor(() => expect(notices.list().map((n) => n.title)).toEqual(['Invitation recorded']));
    expect(notices.list()[0].message).toContain('an invitation to join as a tuner is kept');
    expect((screen.getByLabelText('E-mail') as HTMLInputElement).value).toBe('');
  });
});
