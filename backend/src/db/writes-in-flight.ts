import { setImmediate as nextTurn } from 'node:timers/promises';

/**
 * Statements sent on a transaction without waiting for each one. Its connection runs them in the
 * order sent while the caller goes on with the next piece of work, so the database writes one
 * batch while the server prepares the next: a bulk import otherwise keeps one of them idle at
 * any moment. `drain` waits for all of them and reports the first failure; a later statement of
 * a failed transaction fails too, and is not the one worth reporting.
 */
export class WritesInFlight {
  private readonly pending: Promise<unknown>[] = [];
  private firstFailure: { error: unknown } | null = null;

  /** Starts a write (a promise already running); its failure is kept for `drain`, never left unhandled. */
  send(write: Promise<unknown>): void {
    this.pending.push(
      write.catch((error: unknown) => {
        this.firstFailure ??= { error };
      }),
    );
  }

  /**
   * Gives the event loop a turn, so that the statements just sent leave for the database (and
   * answers that have come back are taken in) before more computing holds the thread.
   */
  async letThemGo(): Promise<void> {
    await nextTurn();
    if (this.firstFailure) await this.drain();
  }

  /** Waits for every write sent; throws the first failure. */
  async drain(): Promise<void> {
    await Promise.all(this.pending.splice(0));
    if (this.firstFailure) throw this.firstFailure.error;
  }
}
