import ExcelJS from 'exceljs';
import { Router, type Response } from 'express';
import { z } from 'zod';
import { addTemplateSheets, IMPORT_TEMPLATE_NAMES, importStep, templateCsv, type ImportTemplateName } from '../../../shared/src';
import { allow, signedInUser } from '../access/access-policy';
import type { Database } from '../db/database';
import { idFrom, parseRequest } from '../http/validate';
import { receivedImportFile, receiveImportFile, removeReceivedFile } from './import-upload';
import { checkImport, commitImport, discardImport, getImport, importProblemsCsv, listImports, type CommitQueue } from './imports.service';

const templateParameters = z.strictObject({
  name: z.enum(IMPORT_TEMPLATE_NAMES, `expected one of ${IMPORT_TEMPLATE_NAMES.join(', ')}`),
  format: z.enum(['csv', 'xlsx'], 'expected csv or xlsx'),
});

/** A template workbook of these templates as a download. */
async function sendWorkbook(res: Response, fileName: string, names: readonly ImportTemplateName[]): Promise<void> {
  const workbook = new ExcelJS.Workbook();
  addTemplateSheets(workbook, names);
  res.type('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet').attachment(fileName);
  res.send(Buffer.from(await workbook.xlsx.writeBuffer()));
}

/** Imports of spreadsheets: templates, the check of an upload, the history and its error reports. */
export function importsRouter(db: Database, { sizeLimitBytes, queue }: { sizeLimitBytes: number; queue: CommitQueue | undefined }): Router {
  const router = Router();

  router.get('/import-templates/all.xlsx', allow.signedIn, async (_req, res) => {
    await sendWorkbook(res, 'spanledger-import-templates.xlsx', IMPORT_TEMPLATE_NAMES);
  });
  router.get('/import-templates/:name.:format', allow.signedIn, async (req, res) => {
    const { name, format } = parseRequest(templateParameters, req.params, 'path parameter');
    if (format === 'csv') {
      res.type('text/csv').attachment(`${name}.csv`).send(templateCsv(name));
      return;
    }
    await sendWorkbook(res, `${name}.xlsx`, [name]);
  });
  // Who may import which template is checked row by row against the matrix: inspectors bring findings, raters and managers inventory.
  router.post('/imports', allow.signedIn, receiveImportFile(sizeLimitBytes), async (req, res) => {
    const file = receivedImportFile(req);
    try {
      res.status(201).json(await checkImport({ db, user: signedInUser(req) }, file));
    } finally {
      await removeReceivedFile(file);
    }
  });
  router.get('/imports', allow.to('view'), async (_req, res) => {
    res.json(await listImports({ db }));
  });
  router.get('/imports/:id', allow.to('view'), async (req, res) => {
    res.json(await getImport({ db, user: signedInUser(req) }, idFrom(req.params)));
  });
  router.post('/imports/:id/commit', allow.signedIn, async (req, res) => {
    const id = idFrom(req.params);
    const { version } = parseRequest(importStep, req.body, 'body field');
    const detail = await commitImport({ db, user: signedInUser(req), queue }, id, version);
    // 202: a large file is being written by a background job; its progress is on GET /api/imports/:id.
    res.status(detail.state === 'committing' ? 202 : 200).json(detail);
  });
  router.post('/imports/:id/discard', allow.signedIn, async (req, res) => {
    const id = idFrom(req.params);
    const { version } = parseRequest(importStep, req.body, 'body field');
    res.json(await discardImport({ db, user: signedInUser(req) }, id, version));
  });
  router.get('/imports/:id/problems.csv', allow.to('view'), async (req, res) => {
    const { fileName, csv } = await importProblemsCsv({ db }, idFrom(req.params));
    res.type('text/csv').attachment(fileName).send(csv);
  });
  return router;
}
