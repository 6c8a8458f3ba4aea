/**
 * A stand-in for the Web Locks API (https://w3c.github.io/web-locks/), enough for `request(name, { ifAvailable },
 * callback)`: exclusive locks shared by every "page" of one fake browser, held until the callback's promise settles
 * or the page that holds them dies (as the browser releases a closed or crashed page's locks).
 */
export class FakeLockBrowser {
  private readonly held = new Map<string, number>();
  private pages = 0;

  /** A LockManager for one page, and a function that kills the page (its locks are released). */
  page(): { locks: LockManager; die: () => void } {
    const owner = ++this.pages;
    const held = this.held;
    const locks = {
      async request(name: string, options: { ifAvailable?: boolean }, callback: (lock: { name: string } | null) => unknown) {
        if (held.has(name)) {
          if (!options.ifAvailable) throw new Error('FakeLockBrowser: waiting for a lock is not supported');
          return callback(null);
        }
        held.set(name, owner);
        try {
          return await callback({ name });
        } finally {
          if (held.get(name) === owner) held.delete(name);
        }
      },
      async query() {
        return { held: [...held.keys()].map((name) => ({ name, mode: 'exclusive' })), pending: [] };
      },
    } as unknown as LockManager;
    const die = () => {
      for (const [name, o] of [...held]) if (o === owner) held.delete(name);
    };
    return { locks, die };
  }

  isHeld(name: string): boolean {
    return this.held.has(name);
  }
}
