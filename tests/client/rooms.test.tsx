// @vitest-environment jsdom
import { cleanup, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { CreateRoomForm } from '../../client/features/rooms/components/create-room-form';
import { RoomList } from '../../client/features/rooms/components/room-list';
import { explainRouteError } from '../../client/components/route-error';
import { ApiError } from '../../client/lib/api-client';
import { answerWith, renderApp } from './support/render';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('RoomList', () => {
  it('shows each room with the user’s role, when it changed, and where a branch came from', () => {
    answerWith();
    renderApp(
      <RoomList
        rooms={[
          { id: 'r1', name: '433 MHz whip — low-cost branch', role: 'tuner', updatedAt: Date.now() - 2 * 3600_000, parent: { snapshotId: 's1', snapshotLabel: 'E12 values', roomId: 'r0', roomName: '433 MHz whip antenna' } },
          { id: 'r2', name: 'Hidden parent', role: 'observer', updatedAt: Date.now(), parent: { snapshotId: 's2', snapshotLabel: null, roomId: null, roomName: null } },
        ]}
      />,
    );
    const [branch, other] = within(screen.getByRole('list', { name: 'Your rooms' })).getAllByRole('listitem');
    expect(within(branch).getByRole('link', { name: '433 MHz whip — low-cost branch' }).getAttribute('href')).toBe('/rooms/r1');
    expect(within(branch).getByText('tuner')).toBeTruthy();
    expect(branch.textContent).toContain('Branch of snapshot “E12 values” in 433 MHz whip antenna');
    expect(within(branch).getByRole('link', { name: '433 MHz whip antenna' }).getAttribute('href')).toBe('/rooms/r0');
    expect(within(branch).getByText('2 hours ago').tagName).toBe('TIME');
    // A parent the user may not see is named only as "a snapshot", with no link.
    expect(other.textContent).toContain('Branch of a snapshot');
    expect(within(other).getAllByRole('link')).toHaveLength(1);
    expect(within(other).getByText('observer')).toBeTruthy();
  });

  it('says what to do when the user is in no room', () => {
    answerWith();
    renderApp(<RoomList rooms={[]} />);
    expect(screen.getByText(/You are not in any room yet/)).toBeTruthy();
  });
});

describe('CreateRoomForm', () => {
  it('puts the server’s message about the name beside the name field', async () => {
    answerWith({ status: 400, body: { error: { code: 'invalid-input', message: 'name: must be at most 200 characters', field: 'name' } } });
    const onCreated = vi.fn();
    renderApp(<CreateRoomForm onCreated={onCreated} />);
    await userEvent.type(screen.getByLabelText('Room name'), 'Whip');
    await userEvent.click(screen.getByRole('button', { name: 'Create room' }));
    const message = await screen.findByText('must be at most 200 characters');
    expect(screen.getByLabelText('Room name').getAttribute('aria-describedby')).toBe(message.id);
    expect(onCreated).not.toHaveBeenCalled();
  });

  it('creates the room and hands back its id', async () => {
    const server = answerWith({ status: 201, body: { id: 'new-room', name: 'Whip', role: 'owner' } });
    const onCreated = vi.fn();
    renderApp(<CreateRoomForm onCreated={onCreated} />);
    await userEvent.type(screen.getByLabelText('Room name'), '  Whip  ');
    await userEvent.click(screen.getByRole('button', { name: 'Create room' }));
    await waitFor(() => expect(onCreated).toHaveBeenCalledWith('new-room'));
    expect(server.requests[0]).toEqual({ method: 'POST', url: '/api/rooms', body: { name: 'Whip' } });
  });
});

describe('explainRouteError', () => {
  it('words a 404, a 403, another API error and a crash differently', () => {
    expect(explainRouteError(new ApiError(404, 'not-found', 'There is no such room.'))).toEqual({ title: 'Nothing here', message: 'There is no such room.' });
    expect(explainRouteError(new ApiError(403, 'forbidden', 'Your role does not allow that.')).title).toBe('Not yours to open');
    expect(explainRouteError(new ApiError(0, 'network', 'The server could not be reached.'))).toEqual({
      title: 'The server could not answer',
      message: 'The server could not be reached.',
    });
    expect(explainRouteError(new TypeError('x is undefined')).title).toBe('Something broke on this page');
  });
});
