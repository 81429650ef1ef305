import { z } from 'zod';
import { strandRowSchema } from '../engine/calc-file/girder';
import { girderRecord, type GirderRecord } from '../girder-record';
import { newFinding, type NewFinding } from '../inspections';
import { newStructure, spanChange, type NewStructure, type SpanChange } from '../inventory';
import type { ImportTemplateName } from './columns';

/**
 * The body each template's row becomes, and the API schema that judges it. Rows are checked
 * with the API's own schemas (newStructure, spanChange, girderRecord, strandRowSchema,
 * newFinding). Where such a schema needs something only the database knows — the version of
 * a span, the id of a girder or of its catalogue type — a stand-in fills it for the check
 * and is taken out again; the server puts in the real one and its own checks run again.
 */

const STAND_IN_ID = 1;
const STAND_IN_VERSION = 1;

const structureNumber = newStructure.shape.structureNumber;
const ordinal = z.number().int('must be a whole number').min(1, 'must be 1 or more').max(999, 'must be at most 999');
const isoDate = z.iso.date('expected a date YYYY-MM-DD');
const ratingFactor = z.number().nonnegative('must be >= 0').max(100, 'must be at most 100');

export type StructureImport = NewStructure;

export interface SpanImport {
  readonly structureNumber: string;
  readonly spanIndex: number;
  /** The span's fields as `PATCH /api/spans/:id` takes them, without the version. */
  readonly span: Omit<SpanChange, 'version'>;
}

export interface GirderImport {
  readonly structureNumber: string;
  readonly spanIndex: number;
  readonly girderNumber: number;
  /** The catalogue girder type by name (the server finds its id), or null for a custom section. */
  readonly girderTypeName: string | null;
  /** The girder record without the type's id and without strand rows, which come from the strand-rows template. */
  readonly record: Omit<GirderRecord, 'girderTypeId' | 'strandRows'>;
}

export interface StrandRowImport {
  readonly structureNumber: string;
  readonly spanIndex: number;
  readonly girderNumber: number;
  readonly strandRow: GirderRecord['strandRows'][number];
}

export interface FindingImport {
  readonly structureNumber: string;
  readonly spanIndex: number;
  readonly girderNumber: number;
  /** The inspection of the structure the finding is recorded in, by its date. */
  readonly inspectedOn: string;
  /** The finding as `POST /api/inspections/:id/findings` takes it, without the girder's id. */
  readonly finding: Omit<NewFinding, 'girderId'>;
}

/**
 * A rating on file from before Spanledger, for a structure or one span. The API has no route for
 * prior ratings yet; this schema is the one its import route should use.
 */
export const priorRatingImport = z
  .strictObject({
    structureNumber,
    spanIndex: ordinal.nullable().default(null),
    lowestLegalRatingFactor: ratingFactor.nullable().default(null),
    designInventoryRatingFactor: ratingFactor.nullable().default(null),
    approvedOn: isoDate,
    sourceNote: z.string().trim().min(1, 'is required').max(1000, 'at most 1000 characters'),
  })
  .superRefine((rating, ctx) => {
    if (rating.lowestLegalRatingFactor === null && rating.designInventoryRatingFactor === null) {
      ctx.addIssue({ code: 'custom', path: ['lowestLegalRatingFactor'], message: 'give the lowest legal rating factor, the design inventory one, or both' });
    }
  });
export type PriorRatingImport = z.output<typeof priorRatingImport>;

export interface ImportBodies {
  readonly structures: StructureImport;
  readonly spans: SpanImport;
  readonly girders: GirderImport;
  readonly 'strand-rows': StrandRowImport;
  readonly findings: FindingImport;
  readonly 'prior-ratings': PriorRatingImport;
}

/** The parts of an assembled row that stand-ins go into, before the schema has typed it. */
export interface AssembledBody {
  span?: Record<string, unknown>;
  record?: Record<string, unknown>;
  finding?: Record<string, unknown>;
  girderTypeName?: unknown;
}

/**
 * How a template's assembled row is checked: stand-ins put in, the schema, stand-ins taken out.
 * The row's body is the row's own, so stand-ins go into it in place rather than into a copy; they
 * come out of the schema's output as a copy without them, because `delete` would turn every
 * checked body of a large file into a slow dictionary-mode object.
 */
interface BodyCheck {
  readonly schema: z.ZodType;
  readonly putStandIns?: (body: AssembledBody) => void;
  readonly takeStandInsOut?: (body: AssembledBody) => void;
}

const girderKey = { structureNumber, spanIndex: ordinal, girderNumber: ordinal };

export const BODY_CHECKS: Readonly<Record<ImportTemplateName, BodyCheck>> = {
  structures: { schema: newStructure },
  spans: {
    schema: z.strictObject({ structureNumber, spanIndex: ordinal, span: spanChange }),
    putStandIns: (body) => {
      (body.span ??= {})['version'] = STAND_IN_VERSION;
    },
    takeStandInsOut: (body) => {
      const { version: _version, ...span } = body.span!;
      body.span = span;
    },
  },
  girders: {
    schema: z.strictObject({
      ...girderKey,
      girderTypeName: z.string().trim().min(1).max(120, 'at most 120 characters').nullable().default(null),
      record: girderRecord,
    }),
    putStandIns: (body) => {
      const record = (body.record ??= {});
      record['girderTypeId'] = body.girderTypeName == null ? null : STAND_IN_ID;
      record['strandRows'] = [];
    },
    takeStandInsOut: (body) => {
      const { girderTypeId: _girderTypeId, strandRows: _strandRows, ...record } = body.record!;
      body.record = record;
    },
  },
  'strand-rows': { schema: z.strictObject({ ...girderKey, strandRow: strandRowSchema }) },
  findings: {
    schema: z.strictObject({ ...girderKey, inspectedOn: isoDate, finding: newFinding }),
    putStandIns: (body) => {
      (body.finding ??= {})['girderId'] = STAND_IN_ID;
    },
    takeStandInsOut: (body) => {
      const { girderId: _girderId, ...finding } = body.finding!;
      body.finding = finding;
    },
  },
  'prior-ratings': { schema: priorRatingImport },
};
