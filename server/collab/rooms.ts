/**
 * The rooms loaded in this process. A room loads on its first socket, and unloads (compacted, freed)
 * `unloadDelayMs` after its last socket leaves. A socket arriving while its room unloads waits for the
 * unload to finish and then gets a freshly loaded room, so no update is ever applied to a freed document.
 */
import { Room, type RoomDeps } from './room';

export class RoomRegistry {
  private readonly rooms = new Map<string, Room>();
  private readonly loading = new Map<string, Promise<Room>>();
  private readonly unloading = new Set<Promise<void>>();

  constructor(private readonly deps: RoomDeps) {}

  /** The loaded room, if any (for role changes on open sockets). */
  get(roomId: string): Room | undefined {
    const r = this.rooms.get(roomId);
    return r && r.state === 'open' ? r : undefined;
  }

  all(): Room[] {
    return [...this.rooms.values()];
  }

  /** The room, loaded if need be, retained for one socket (call `release` if the socket never attaches). */
  async acquire(roomId: string): Promise<Room> {
    for (;;) {
      const existing = this.rooms.get(roomId);
      if (existing?.state === 'open') {
        existing.retain();
        return existing;
      }
      if (existing) {
        await existing.closed;
        continue;
      }
      let p = this.loading.get(roomId);
      if (!p) {
        p = Room.load(roomId, this.deps, (room) => this.unload(room)).then(
          (room) => {
            this.loading.delete(roomId);
            this.rooms.set(roomId, room);
            return room;
          },
          (e: unknown) => {
            this.loading.delete(roomId);
            throw e;
          },
        );
        this.loading.set(roomId, p);
      }
      const room = await p;
      if (room.state === 'open') {
        room.retain();
        return room;
      }
    }
  }

  /** Unload one room (after its idle delay, or because it was deleted). */
  unload(room: Room, opts?: Parameters<Room['unload']>[0]): Promise<void> {
    const done = room.unload(opts).then(
      () => {
        if (this.rooms.get(room.id) === room) this.rooms.delete(room.id);
      },
      (e: unknown) => {
        if (this.rooms.get(room.id) === room) this.rooms.delete(room.id);
        this.deps.logger.error({ roomId: room.id, err: e }, 'room unload failed');
      },
    );
    this.unloading.add(done);
    void done.finally(() => this.unloading.delete(done));
    return done;
  }

  /** Unload everything (shutdown). */
  async closeAll(): Promise<void> {
    await Promise.allSettled([...this.loading.values()]);
    await Promise.all(this.all().map((r) => this.unload(r)));
    await Promise.all([...this.unloading]);
  }
}
