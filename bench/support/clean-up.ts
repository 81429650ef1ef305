interface CleanUpStep {
  readonly what: string;
  readonly stop: () => Promise<void>;
}

async function stopStep(step: CleanUpStep): Promise<boolean> {
  try {
    await step.stop();
    return true;
  } catch (error) {
    console.error(`Could not stop ${step.what}: ${error instanceof Error ? error.message : String(error)}`);
    return false;
  }
}

/**
 * What a benchmark started, stopped in the reverse order. Unlike the jest teardown registry it
 * goes on past a step that fails, so one stuck server never leaves a cluster running.
 */
export class CleanUp {
  private steps: CleanUpStep[] = [];
  private stopping: Promise<boolean> | null = null;

  /**
   * Registers how to stop something just started; the last added stops first. Once stopping has
   * begun (an interruption), the newcomer is stopped at once and the benchmark goes no further.
   */
  add(what: string, stop: () => Promise<void>): void {
    if (this.stopping) {
      this.stopping = this.stopping.then(async (clean) => (await stopStep({ what, stop })) && clean);
      throw new Error(`interrupted while starting ${what}`);
    }
    this.steps = [{ what, stop }, ...this.steps];
  }

  /** Stops everything registered, once; a later call waits for the same work. True when every step succeeded. */
  run(): Promise<boolean> {
    this.stopping ??= this.stopAll();
    return this.stopping;
  }

  private async stopAll(): Promise<boolean> {
    let clean = true;
    for (const step of this.steps) clean = (await stopStep(step)) && clean;
    this.steps = [];
    return clean;
  }
}

const INTERRUPTIONS = { SIGINT: 130, SIGTERM: 143 } as const;
type Interruption = keyof typeof INTERRUPTIONS;
/** After an interruption the benchmark is given this long to notice before the process exits regardless. */
const FORCED_EXIT_MS = 30_000;

/**
 * Runs one benchmark and then its clean-up, whether it finishes, throws or is interrupted
 * (Ctrl-C, SIGTERM), and exits: 0 with its figures printed, 1 when it could not produce them.
 */
export function runBenchmark(body: (cleanUp: CleanUp) => Promise<void>): void {
  const cleanUp = new CleanUp();
  let interruption: Interruption | null = null;
  for (const signal of Object.keys(INTERRUPTIONS) as Interruption[]) {
    process.once(signal, () => {
      interruption = signal;
      console.error(`\n${signal}: stopping what the benchmark started…`);
      // Stopping the server and the browser makes the benchmark's next step fail, which ends it.
      void cleanUp.run();
      setTimeout(() => void cleanUp.run().finally(() => process.exit(INTERRUPTIONS[signal])), FORCED_EXIT_MS);
    });
  }
  const finish = async (): Promise<number> => {
    let succeeded = true;
    try {
      await body(cleanUp);
    } catch (error) {
      succeeded = false;
      if (!interruption) console.error(`The benchmark failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
    }
    const clean = await cleanUp.run();
    if (interruption) return INTERRUPTIONS[interruption];
    return succeeded && clean ? 0 : 1;
  };
  // Exit explicitly: a pool or socket left open by a failed step must not keep the run alive.
  void finish().then((code) => process.exit(code));
}
