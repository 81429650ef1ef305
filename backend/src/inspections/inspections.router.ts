import { Router } from 'express';
import { findingChange, inspectionChange, inspectionReturn, inspectionStep, newFinding, newInspection } from '../../../shared/src';
import { allow, signedInUser } from '../access/access-policy';
import type { Database } from '../db/database';
import { idFrom, parseRequest } from '../http/validate';
import type { ObjectStorage } from '../photos/object-storage';
import {
  acceptInspection,
  addFinding,
  changeFinding,
  changeInspection,
  getInspection,
  girderFindings,
  listInspectionsOfStructure,
  openFindingsOfSpan,
  removeFinding,
  removeInspection,
  returnInspection,
  startInspection,
  submitInspection,
} from './inspections.service';

/** Field inspections, their findings and the damage register. */
export function inspectionsRouter(db: Database, storage: ObjectStorage): Router {
  const router = Router();
  const writer = (req: Parameters<typeof signedInUser>[0]) => ({ db, user: signedInUser(req) });

  router.get('/structures/:id/inspections', allow.to('view'), async (req, res) => {
    res.json(await listInspectionsOfStructure({ db }, idFrom(req.params)));
  });
  router.post('/structures/:id/inspections', allow.to('editOwnInspections'), async (req, res) => {
    const structureId = idFrom(req.params);
    const input = parseRequest(newInspection, req.body, 'body field');
    res.status(201).json(await startInspection(writer(req), structureId, input));
  });
  router.get('/inspections/:id', allow.to('view'), async (req, res) => {
    res.json(await getInspection({ db }, idFrom(req.params)));
  });
  router.patch('/inspections/:id', allow.to('editOwnInspections'), async (req, res) => {
    const id = idFrom(req.params);
    res.json(await changeInspection(writer(req), id, parseRequest(inspectionChange, req.body, 'body field')));
  });
  router.delete('/inspections/:id', allow.to('editOwnInspections'), async (req, res) => {
    await removeInspection({ ...writer(req), storage }, idFrom(req.params));
    res.sendStatus(204);
  });
  router.post('/inspections/:id/findings', allow.to('editOwnInspections'), async (req, res) => {
    const id = idFrom(req.params);
    res.status(201).json(await addFinding(writer(req), id, parseRequest(newFinding, req.body, 'body field')));
  });
  router.put('/findings/:id', allow.to('editOwnInspections'), async (req, res) => {
    const id = idFrom(req.params);
    res.json(await changeFinding(writer(req), id, parseRequest(findingChange, req.body, 'body field')));
  });
  router.delete('/findings/:id', allow.to('editOwnInspections'), async (req, res) => {
    await removeFinding(writer(req), idFrom(req.params));
    res.sendStatus(204);
  });
  router.post('/inspections/:id/submit', allow.to('editOwnInspections'), async (req, res) => {
    const id = idFrom(req.params);
    const { version } = parseRequest(inspectionStep, req.body, 'body field');
    res.json(await submitInspection(writer(req), id, version));
  });
  router.post('/inspections/:id/accept', allow.to('reviewInspections'), async (req, res) => {
    const id = idFrom(req.params);
    const { version } = parseRequest(inspectionStep, req.body, 'body field');
    res.json(await acceptInspection(writer(req), id, version));
  });
  router.post('/inspections/:id/return', allow.to('reviewInspections'), async (req, res) => {
    const id = idFrom(req.params);
    const { version, comment } = parseRequest(inspectionReturn, req.body, 'body field');
    res.json(await returnInspection(writer(req), id, version, comment));
  });
  router.get('/girders/:id/findings', allow.to('view'), async (req, res) => {
    res.json(await girderFindings({ db }, idFrom(req.params)));
  });
  router.get('/spans/:id/open-findings', allow.to('view'), async (req, res) => {
    res.json(await openFindingsOfSpan({ db }, idFrom(req.params)));
  });
  return router;
}
