import { WritesInFlight } from './writes-in-flight';

/** A write that settles after `turns` turns of the event loop, the way a statement's answer arrives. */
function writeSettlingAfter<T>(turns: number, outcome: () => T): Promise<T> {
  return new Promise((resolve, reject) => {
    const step = (left: number): void => {
      if (left > 0) {
        setImmediate(() => step(left - 1));
        return;
      }
      try {
        resolve(outcome());
      } catch (error) {
        reject(error);
      }
    };
    step(turns);
  });
}

describe('WritesInFlight', () => {
  it('waits for every write sent before drain returns', async () => {
    const writes = new WritesInFlight();
    const done: number[] = [];
    writes.send(writeSettlingAfter(3, () => done.push(1)));
    writes.send(writeSettlingAfter(1, () => done.push(2)));
    await writes.drain();
    expect(done.sort()).toEqual([1, 2]);
  });

  it('reports the first failure, not those of the writes that failed after it', async () => {
    const writes = new WritesInFlight();
    writes.send(writeSettlingAfter(1, () => {
      throw new Error('first: the statement was refused');
    }));
    writes.send(writeSettlingAfter(4, () => {
      throw new Error('later: the transaction is aborted');
    }));
    await expect(writes.drain()).rejects.toThrow('first: the statement was refused');
  });

  it('stops the caller at its next turn once a write has failed, without an unhandled rejection', async () => {
    const unhandled: unknown[] = [];
    const onUnhandled = (reason: unknown) => unhandled.push(reason);
    process.on('unhandledRejection', onUnhandled);
    try {
      const writes = new WritesInFlight();
      writes.send(Promise.reject(new Error('refused at once')));
      await expect(writes.letThemGo()).rejects.toThrow('refused at once');
      await new Promise((resolve) => setImmediate(resolve));
      expect(unhandled).toEqual([]);
    } finally {
      process.off('unhandledRejection', onUnhandled);
    }
  });

  it('lets the caller go on while no write has failed', async () => {
    const writes = new WritesInFlight();
    writes.send(writeSettlingAfter(5, () => 'written'));
    await expect(writes.letThemGo()).resolves.toBeUndefined();
    await writes.drain();
  });
});
