type Teardown = () => Promise<void>;

// jest runs global setup and teardown in the same process and shares globalThis between them.
const registry = globalThis as typeof globalThis & { spanledgerTeardowns?: Teardown[] };

/** Queues a clean-up for the end of the run; the last registered runs first. */
export function registerTeardown(teardown: Teardown): void {
  registry.spanledgerTeardowns = [teardown, ...(registry.spanledgerTeardowns ?? [])];
}

export default async function globalTeardown(): Promise<void> {
  const teardowns = registry.spanledgerTeardowns ?? [];
  registry.spanledgerTeardowns = [];
  for (const teardown of teardowns) await teardown();
}
