import type { Knex } from 'knex';
import { demoStructures, seededRandom } from './demo-structures';

/**
 * The demo structures' condition ratings (0–9), skew, last major work and status: older
 * bridges tend to rate lower, a few are posted and one is closed. Invented for the demo.
 */
export function demoConditions(): Array<{ structure_number: string; values: Record<string, unknown> }> {
  const random = seededRandom(20261216);
  const pick = (low: number, high: number) => low + Math.floor(random() * (high - low + 1));
  return demoStructures().map((structure, index) => {
    const age = 2026 - structure.year_built;
    const ageLoss = age > 45 ? 2 : age > 25 ? 1 : 0;
    const superstructure = Math.max(3, pick(6, 8) - ageLoss);
    const status = index % 17 === 5 ? 'posted' : index === 30 ? 'closed' : 'open';
    const majorWork = age > 35 && random() < 0.4 ? structure.year_built + pick(20, 30) : null;
    return {
      structure_number: structure.structure_number,
      values: {
        deck_condition: Math.max(3, pick(5, 8) - ageLoss),
        superstructure_condition: status === 'open' ? superstructure : Math.min(superstructure, 4),
        substructure_condition: Math.max(4, pick(6, 8) - ageLoss),
        condition_rated_on: `2026-${String(pick(3, 10)).padStart(2, '0')}-${String(pick(1, 28)).padStart(2, '0')}`,
        skew_deg: random() < 0.6 ? 0 : pick(1, 6) * 5,
        year_last_major_work: majorWork,
        status,
        notes: status === 'closed' ? 'Closed to traffic pending repair of the bottom flanges (demo).' : '',
      },
    };
  });
}

/** Knex seed entry point: sets the condition fields of the demo structures that still lack them. */
export async function seed(knex: Knex): Promise<void> {
  for (const { structure_number, values } of demoConditions()) {
    await knex('structures').where({ structure_number }).whereNull('superstructure_condition').update(values);
  }
}
