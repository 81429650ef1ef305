import type { Database, Transaction } from '../db/database';

/** A girder of a span with what its list shows: its type's name and its strand rows counted. */
export interface GirderListRow {
  id: number;
  span_id: number;
  girder_number: number;
  position: 'interior' | 'exterior';
  girder_type_name: string | null;
  strand_row_count: string;
  strand_count: string | null;
  harped: boolean;
  debonded: boolean;
  concrete_strength_mpa: number;
  tensioning: 'pre' | 'post';
  version: number;
}

export async function findGirdersOfSpan(db: Database | Transaction, spanId: number): Promise<GirderListRow[]> {
  return db({ g: 'girders' })
    .leftJoin({ t: 'girder_types' }, 't.id', 'g.girder_type_id')
    .leftJoin({ r: 'strand_rows' }, 'r.girder_id', 'g.id')
    .where('g.span_id', spanId)
    .groupBy('g.id', 't.name')
    .orderBy('g.girder_number')
    .select(
      'g.id',
      'g.span_id',
      'g.girder_number',
      'g.position',
      't.name as girder_type_name',
      db.raw('count(r.id) as strand_row_count'),
      db.raw('sum(r.strand_count) as strand_count'),
      db.raw("jsonb_array_length(g.profiles) > 0 as harped"),
      db.raw("jsonb_array_length(g.debonding) > 0 as debonded"),
      db.raw("(g.concrete->>'strengthMpa')::double precision as concrete_strength_mpa"),
      'g.tensioning',
      'g.version',
    );
}

export interface GirderTypeRow {
  id: number;
  name: string;
  section: Record<string, unknown> & { shape: string; depthMm?: number };
  source: string;
}

export async function findGirderTypes(db: Database | Transaction): Promise<GirderTypeRow[]> {
  return db<GirderTypeRow>('girder_types').select('id', 'name', 'section', 'source').orderBy('name');
}
