import { z } from 'zod';
import { barSchema, concreteSchema, deckSchema, strandRowSchema } from './engine/calc-file/girder';
import { debondingSchema, profileSchema } from './engine/calc-file/rate-file';
import { lossesSchema } from './engine/losses/schema';
import { sectionShapeSchema } from './engine/section';
import type { UserStamp } from './inventory';

/**
 * A girder as the inventory keeps it: each part is the calculation file's own (docs/calc-file.md)
 * — the section (a catalogue type with overrides, or a custom shape), concrete, strand rows, bars,
 * profiles, debonding and losses — so a rating is assembled from it without loss. The deck's size
 * comes from the span; the girder keeps the deck concrete.
 */
const girderRecordShape = {
  position: z.enum(['interior', 'exterior']),
  /** A girder type of the catalogue, or null for a custom section. */
  girderTypeId: z.number().int().positive().nullable(),
  /** Dimensions of the type's section this girder changes, by the section's own keys (e.g. `depthMm`). */
  sectionOverrides: z.record(z.string(), z.number()).default({}),
  customSection: sectionShapeSchema.nullable().default(null),
  concrete: concreteSchema,
  deckConcrete: deckSchema.pick({ strengthMpa: true, basis: true, unitWeightKnM3: true, elasticModulusMpa: true }),
  strandRows: z.array(strandRowSchema),
  bars: z.array(barSchema).default([]),
  tensioning: z.enum(['pre', 'post']).default('pre'),
  profiles: z.array(profileSchema).default([]),
  debonding: z.array(debondingSchema).default([]),
  losses: lossesSchema.default({ method: 'given' }),
};

type GirderRecordFields = z.output<z.ZodObject<typeof girderRecordShape>>;

/** The rules between a girder's parts that no single part can check. */
function girderRecordRules(girder: GirderRecordFields, ctx: z.RefinementCtx): void {
  if (girder.girderTypeId === null && girder.customSection === null) {
    ctx.addIssue({ code: 'custom', path: ['customSection'], message: 'give a custom section, or choose a girder type' });
  }
  if (girder.girderTypeId !== null && girder.customSection !== null) {
    ctx.addIssue({ code: 'custom', path: ['customSection'], message: 'a girder of a catalogue type has no custom section; change its dimensions with sectionOverrides' });
  }
  const ids = girder.strandRows.map((row) => row.id);
  ids.forEach((id, index) => {
    if (ids.indexOf(id) !== index) ctx.addIssue({ code: 'custom', path: ['strandRows', index, 'id'], message: `row id "${id}" is used twice` });
  });
}

export const girderRecord = z.strictObject(girderRecordShape).superRefine(girderRecordRules);
export type GirderRecord = z.output<typeof girderRecord>;
export type GirderRecordInput = z.input<typeof girderRecord>;

/** Body of `PUT /api/girders/:id`: the whole girder (strand rows are replaced as a whole) and the version read. */
export const girderChange = z
  .strictObject({ version: z.number({ error: 'the version you read is required' }).int().positive(), ...girderRecordShape })
  .superRefine(girderRecordRules);
export type GirderChange = z.output<typeof girderChange>;

/** `GET /api/girders/:id`: the stored record, where it sits, and its section as the engine sees it. */
export interface GirderDetail extends GirderRecord {
  readonly id: number;
  readonly spanId: number;
  readonly spanIndex: number;
  readonly structureId: number;
  readonly structureNumber: string;
  readonly district: string;
  readonly girderNumber: number;
  readonly girderTypeName: string | null;
  /** The type's section with this girder's overrides, or the custom section. */
  readonly section: Record<string, unknown>;
  readonly version: number;
  readonly updated: UserStamp;
}

const girderTypeFields = {
  name: z.string().trim().min(1, 'is required').max(120, 'at most 120 characters'),
  section: sectionShapeSchema,
  /** The published table the shape comes from, or "from memory — verify", or the owner's own drawing. */
  source: z.string().trim().min(1, 'name the published table or drawing the dimensions come from').max(500, 'at most 500 characters'),
};

/** Body of `POST /api/girder-types`. */
export const newGirderType = z.strictObject(girderTypeFields);
export type NewGirderType = z.output<typeof newGirderType>;

/** Body of `PATCH /api/girder-types/:id`. */
export const girderTypeChange = z.strictObject({
  version: z.number({ error: 'the version you read is required' }).int().positive(),
  name: girderTypeFields.name.optional(),
  section: girderTypeFields.section.optional(),
  source: girderTypeFields.source.optional(),
});
export type GirderTypeChange = z.output<typeof girderTypeChange>;
