import { AbstractControl, FormArray, FormControl, FormGroup, FormRecord, NonNullableFormBuilder } from '@angular/forms';
import {
  girderChange,
  sectionShapeSchema,
  type GirderChange,
  type GirderDetail,
  type GirderRecord,
  type GirderTypeSummary,
  type SectionShape,
  type StrandRow,
} from '@spanledger/shared';

import { PROBLEM, placeProblems, schemaProblems, type FieldProblem } from '../structures/field-problems';
import { overridableFieldsOf, sectionFieldsOf, type SectionField, type SectionShapeName } from './girder-fields';
import type { NumberList } from './number-list-input.directive';

type Measured = FormControl<number | null>;
type Listed = FormControl<NumberList | null>;
/** A section dimension: a number, or a list of points for a profile or polygon. */
export type SectionValue = number | NumberList | null;
type Profile = GirderRecord['profiles'][number];
type Losses = GirderRecord['losses'];
type LossesMethod = Losses['method'];
type StrandType = Extract<Losses, { method: 'aashto-approximate' }>['strandType'];
type Basis = GirderRecord['concrete']['basis'];

export type StrandRowGroup = FormGroup<{
  id: FormControl<string>;
  yMm: Measured;
  count: Measured;
  xMm: Listed;
  strandAreaMm2: Measured;
  strandDiameterMm: Measured;
  fpuMpa: Measured;
  fpyMpa: Measured;
  epsMpa: Measured;
  fpeMpa: Measured;
  bonded: FormControl<boolean>;
  unbondedLengthMm: Measured;
}>;
export type ProfileGroup = FormGroup<{ rowId: FormControl<string>; shape: FormControl<Profile['shape']>; endYMm: Measured; holdDownM: FormArray<Measured> }>;
export type DebondingGroup = FormGroup<{ rowId: FormControl<string>; strands: Listed; lengthM: Measured }>;

/** The girder editor's form: the girder record's parts, every value in SI (the inputs convert). */
export function girderForm(fb: NonNullableFormBuilder) {
  const concrete = () =>
    fb.group({
      strengthMpa: fb.control<number | null>(null),
      basis: fb.control<Basis>('cylinder'),
      unitWeightKnM3: fb.control<number | null>(null),
      elasticModulusMpa: fb.control<number | null>(null),
    });
  return fb.group({
    position: fb.control<GirderRecord['position']>('interior'),
    /** A catalogue type, or null for a custom section. */
    girderTypeId: fb.control<number | null>(null),
    /** A catalogue type's dimensions as this girder has them (the type's own, or overridden). */
    sectionOverrides: new FormRecord<FormControl<SectionValue>>({}),
    customShape: fb.control<SectionShapeName>('rectangle'),
    customSection: new FormRecord<FormControl<SectionValue>>({}),
    concrete: concrete(),
    deckConcrete: concrete(),
    tensioning: fb.control<GirderRecord['tensioning']>('pre'),
    strandRows: fb.array<StrandRowGroup>([]),
    profiles: fb.array<ProfileGroup>([]),
    debonding: fb.array<DebondingGroup>([]),
    losses: fb.group({
      method: fb.control<LossesMethod>('given'),
      jackingStressMpa: fb.control<number | null>(null),
      fciMpa: fb.control<number | null>(null),
      relativeHumidityPct: fb.control<number | null>(null),
      strandType: fb.control<StrandType>('low-relaxation'),
      eciMpa: fb.control<number | null>(null),
    }),
  });
}
export type GirderForm = ReturnType<typeof girderForm>;

/** A strand row's values as given or as the form holds them (empty inputs are null). */
export type StrandRowValues = { readonly [K in Exclude<keyof StrandRow, 'xMm'>]?: StrandRow[K] | null } & { readonly xMm?: NumberList | null };

export function strandRowGroup(fb: NonNullableFormBuilder, row: StrandRowValues = {}): StrandRowGroup {
  return fb.group({
    id: fb.control(row.id ?? ''),
    yMm: fb.control<number | null>(row.yMm ?? null),
    count: fb.control<number | null>(row.count ?? null),
    xMm: fb.control<NumberList | null>(row.xMm ?? null),
    strandAreaMm2: fb.control<number | null>(row.strandAreaMm2 ?? null),
    strandDiameterMm: fb.control<number | null>(row.strandDiameterMm ?? null),
    fpuMpa: fb.control<number | null>(row.fpuMpa ?? null),
    fpyMpa: fb.control<number | null>(row.fpyMpa ?? null),
    epsMpa: fb.control<number | null>(row.epsMpa ?? null),
    fpeMpa: fb.control<number | null>(row.fpeMpa ?? null),
    bonded: fb.control(row.bonded ?? true),
    unbondedLengthMm: fb.control<number | null>(row.unbondedLengthMm ?? null),
  });
}

/** Rows of strands are commonly 50 mm apart (a 2 in grid). */
const ROW_SPACING_MM = 50;

/** A new row starts as a copy of the last one a row spacing higher, spread evenly, so only what differs needs typing. */
export function nextStrandRow(rows: readonly StrandRowValues[]): StrandRowValues {
  const ids = new Set(rows.map((row) => row.id));
  let number = rows.length + 1;
  while (ids.has(`r${number}`)) number++;
  const last = rows[rows.length - 1];
  if (!last) return { id: `r${number}` };
  return { ...last, id: `r${number}`, yMm: typeof last.yMm === 'number' ? last.yMm + ROW_SPACING_MM : null, xMm: null };
}

export function profileGroup(fb: NonNullableFormBuilder, profile: Partial<Profile> = {}): ProfileGroup {
  const endYMm = profile.shape === 'harped' || profile.shape === 'draped' ? profile.endYMm : null;
  const holdDownM: readonly (number | null)[] = profile.shape === 'harped' && profile.holdDownM ? profile.holdDownM : [null, null];
  return fb.group({
    rowId: fb.control(profile.rowId ?? ''),
    shape: fb.control<Profile['shape']>(profile.shape ?? 'harped'),
    endYMm: fb.control<number | null>(endYMm ?? null),
    holdDownM: fb.array(holdDownM.map((point) => fb.control<number | null>(point))),
  });
}

export function debondingGroup(fb: NonNullableFormBuilder, entry: Partial<GirderRecord['debonding'][number]> = {}): DebondingGroup {
  return fb.group({
    rowId: fb.control(entry.rowId ?? ''),
    strands: fb.control<NumberList | null>(entry.strands ?? null),
    lengthM: fb.control<number | null>(entry.lengthM ?? null),
  });
}

/** Puts a girder into the form: its parts, its lists, and its section's dimension inputs. */
export function fillGirderForm(form: GirderForm, fb: NonNullableFormBuilder, girder: GirderDetail, type: GirderTypeSummary | null): void {
  const resolved = girder.section;
  const customShape = (girder.customSection?.shape ?? resolved['shape'] ?? 'rectangle') as SectionShapeName;
  const losses = girder.losses;
  const approximate = losses.method === 'aashto-approximate' ? losses : null;
  // The single values first: a reset also empties what it is not given, so the lists and section inputs follow.
  form.reset({
    position: girder.position,
    girderTypeId: type ? girder.girderTypeId : null,
    customShape,
    concrete: concreteValues(girder.concrete),
    deckConcrete: concreteValues(girder.deckConcrete),
    tensioning: girder.tensioning,
    losses: {
      method: losses.method,
      jackingStressMpa: approximate?.jackingStressMpa ?? null,
      fciMpa: approximate?.fciMpa ?? null,
      relativeHumidityPct: approximate?.relativeHumidityPct ?? null,
      strandType: approximate?.strandType ?? 'low-relaxation',
      eciMpa: approximate?.eciMpa ?? null,
    },
  });
  fillList(form.controls.strandRows, girder.strandRows, (row) => strandRowGroup(fb, row));
  fillList(form.controls.profiles, girder.profiles, (profile) => profileGroup(fb, profile));
  fillList(form.controls.debonding, girder.debonding, (entry) => debondingGroup(fb, entry));
  setSectionControls(form.controls.sectionOverrides, type ? overridableFieldsOf(type.section) : [], resolved);
  setSectionControls(form.controls.customSection, sectionFieldsOf(customShape), girder.customSection ?? resolved);
  form.updateValueAndValidity();
}

/**
 * Brings a list of groups to the items given, keeping the groups already there (refilled), so the
 * rows on screen stay in place rather than all being drawn anew.
 */
function fillList<T, G extends AbstractControl>(list: FormArray<G>, items: readonly T[], groupOf: (item: T) => G): void {
  while (list.length > items.length) list.removeAt(list.length - 1, { emitEvent: false });
  items.forEach((item, index) => {
    const filled = groupOf(item);
    if (index < list.length) (list.at(index) as AbstractControl).reset(filled.getRawValue(), { emitEvent: false });
    else list.push(filled, { emitEvent: false });
  });
}

function concreteValues(concrete: Partial<GirderRecord['concrete']> & { basis: Basis; strengthMpa: number }) {
  return { strengthMpa: concrete.strengthMpa, basis: concrete.basis, unitWeightKnM3: concrete.unitWeightKnM3 ?? null, elasticModulusMpa: concrete.elasticModulusMpa ?? null };
}

/** Replaces a section group's inputs with one per field, each starting from the section's value for its key. */
export function setSectionControls(group: FormRecord<FormControl<SectionValue>>, fields: readonly SectionField[], from: Readonly<Record<string, unknown>>): void {
  Object.keys(group.controls).forEach((key) => group.removeControl(key, { emitEvent: false }));
  for (const field of fields) {
    const value = from[field.key];
    const typed = field.kind === 'length' || field.kind === 'count' ? (typeof value === 'number' ? value : null) : Array.isArray(value) ? (value as NumberList) : null;
    group.addControl(field.key, new FormControl<SectionValue>(typed), { emitEvent: false });
  }
  group.updateValueAndValidity();
}

/** The section the form describes, as the engine will use it: the type's with this girder's dimensions, or the custom one. */
export function resolvedSectionOf(form: GirderForm, type: GirderTypeSummary | null): Record<string, unknown> {
  if (type) return { ...type.section, ...form.controls.sectionOverrides.getRawValue() };
  return { shape: form.controls.customShape.value, ...presentValues(form.controls.customSection.getRawValue()) };
}

/** The record the form holds, as the PUT body names its parts; bars are kept as read, the form does not edit them. */
export function girderRecordOf(form: GirderForm, type: GirderTypeSummary | null, bars: GirderRecord['bars']): Record<string, unknown> {
  const values = form.getRawValue();
  const overrides = type ? Object.fromEntries(Object.entries(values.sectionOverrides).filter(([key, value]) => value !== type.section[key])) : {};
  return {
    position: values.position,
    girderTypeId: type ? type.id : null,
    sectionOverrides: overrides,
    customSection: type ? null : resolvedSectionOf(form, null),
    concrete: present(values.concrete, ['unitWeightKnM3', 'elasticModulusMpa']),
    deckConcrete: present(values.deckConcrete, ['unitWeightKnM3', 'elasticModulusMpa']),
    strandRows: values.strandRows.map(({ xMm, unbondedLengthMm, ...row }) => ({
      ...present(row, ['fpeMpa']),
      ...(xMm === null ? {} : { xMm }),
      ...(row.bonded || unbondedLengthMm === null ? {} : { unbondedLengthMm }),
    })),
    bars,
    tensioning: values.tensioning,
    profiles: values.profiles.map(({ rowId, shape, endYMm, holdDownM }) =>
      shape === 'straight' ? { rowId, shape } : shape === 'draped' ? { rowId, shape, endYMm } : { rowId, shape, endYMm, holdDownM },
    ),
    debonding: values.debonding.map(({ rowId, strands, lengthM }) => ({ rowId, strands: strands ?? [], lengthM })),
    losses: values.losses.method === 'given' ? { method: 'given' } : { ...present(values.losses, ['eciMpa']) },
  };
}

/** Leaves out the optional keys left empty; an empty required value stays, for the schema to name. */
function present<T extends Record<string, unknown>>(values: T, optionalKeys: readonly (keyof T)[]): Partial<T> {
  return Object.fromEntries(Object.entries(values).filter(([key, value]) => value !== null || !optionalKeys.includes(key))) as Partial<T>;
}

function presentValues(values: Record<string, SectionValue>): Record<string, SectionValue> {
  return Object.fromEntries(Object.entries(values).filter(([, value]) => value !== null));
}

/** The checked girder, or the problems that keep it from being drawn and saved, named by record path. */
export type GirderCheck =
  | { readonly ok: true; readonly change: GirderChange; readonly section: SectionShape }
  | { readonly ok: false; readonly problems: readonly FieldProblem[] };

/** Empty and non-numeric inputs are named plainly rather than as "expected number, received null". */
const PLAIN_TYPE_MESSAGES = {
  error: (issue: { code: string; input?: unknown }) => {
    if (issue.code !== 'invalid_type') return undefined;
    if (issue.input === null || issue.input === undefined) return 'is required';
    return typeof issue.input === 'number' && Number.isNaN(issue.input) ? 'must be a number' : undefined;
  },
};

/**
 * Checks the form's girder with the server's own schema (`girderChange`), and a catalogue type's
 * section with this girder's dimensions with the section schema, so the form and the server name
 * the same problems in the same words.
 */
export function checkGirder(record: Record<string, unknown>, version: number, resolvedSection: Record<string, unknown>, type: GirderTypeSummary | null): GirderCheck {
  const checked = girderChange.safeParse({ version, ...record }, PLAIN_TYPE_MESSAGES);
  const section = sectionShapeSchema.safeParse(resolvedSection, PLAIN_TYPE_MESSAGES);
  const sectionProblems = type && !section.success ? prefixed(schemaProblems(section.error), 'sectionOverrides') : [];
  const problems = [...(checked.success ? [] : schemaProblems(checked.error)), ...sectionProblems];
  if (!checked.success || !section.success || problems.length > 0) return { ok: false, problems: uniqueProblems(problems) };
  return { ok: true, change: checked.data, section: section.data };
}

function prefixed(problems: readonly FieldProblem[], prefix: string): FieldProblem[] {
  return problems.map((problem) => ({ ...problem, field: problem.field ? `${prefix}.${problem.field}` : prefix }));
}

function uniqueProblems(problems: readonly FieldProblem[]): FieldProblem[] {
  return problems.filter((problem, index) => problems.findIndex((other) => other.field === problem.field && other.message === problem.message) === index);
}

/**
 * Puts each problem under the input nearest its path: a place inside a list input (`strandRows.0.xMm.3`)
 * goes under the list, named by its place in it; a problem of a pair of inputs (`profiles.0.holdDownM`)
 * under the first. Answers the problems no input shows, for a list above the buttons.
 */
export function placeGirderProblems(form: GirderForm, problems: readonly FieldProblem[]): FieldProblem[] {
  return placeProblems(
    form,
    problems.map((problem) => {
      const input = nearestInput(form, problem.field);
      if (!input) return problem;
      return { field: input.path, message: input.within.length > 0 ? `${placeInList(input.within)}: ${problem.message}` : problem.message };
    }),
  );
}

function nearestInput(form: GirderForm, field: string): { path: string; within: string[] } | null {
  const segments = field.split('.');
  for (let length = segments.length; length > 0; length--) {
    const path = segments.slice(0, length).join('.');
    const control = form.get(path);
    if (control instanceof FormControl) return { path, within: segments.slice(length) };
    if (control instanceof FormArray && length === segments.length && control.at(0) instanceof FormControl) return { path: `${path}.0`, within: [] };
    // A group, or a list of groups: no one input shows its problem.
    if (control) return null;
  }
  return null;
}

function placeInList(within: readonly string[]): string {
  return within.map((segment, depth) => `${depth > 0 && depth === within.length - 1 ? 'value' : 'item'} ${Number(segment) + 1}`).join(', ');
}

/** The problem a control carries for `<mat-error>`, if any. */
export function problemOf(form: GirderForm, path: string): string | null {
  return (form.get(path)?.errors?.[PROBLEM] as string | undefined) ?? null;
}
