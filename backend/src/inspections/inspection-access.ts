import { can, canInDistrict, type SignedInUser } from '../../../shared/src';
import type { Transaction } from '../db/database';
import { AppError } from '../http/app-error';
import { findInspectionById, type InspectionRow } from './inspections.repository';

/**
 * The inspection a change is made to, locked for the change, when the user may make it: only its
 * own inspector changes an inspection (and its findings and photos), inside the inspector's
 * districts, and only while it is a draft or has been returned; submitted ones are read-only.
 */
export async function inspectionOpenForChange(trx: Transaction, user: SignedInUser, inspectionId: number): Promise<InspectionRow> {
  const inspection = await findInspectionById(trx, inspectionId, { forUpdate: true });
  if (!inspection) throw AppError.notFound(`There is no inspection with id ${inspectionId}`);
  if (!can(user, 'editOwnInspections') || inspection.inspector_id !== user.id) {
    throw AppError.forbidden(`Only ${inspection.inspector_name}, who is recording this inspection, may change it`);
  }
  if (!canInDistrict(user, 'editOwnInspections', inspection.district)) {
    throw AppError.forbidden(`You may not record inspections in ${inspection.district}`);
  }
  if (inspection.state !== 'draft' && inspection.state !== 'returned') {
    throw AppError.readOnly(`The inspection of ${inspection.inspected_on} is ${inspection.state}: it can no longer be changed`);
  }
  return inspection;
}
