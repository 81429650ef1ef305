/** Bulk import of spreadsheets: the templates' column contract, row checks and template files. */
export {
  IMPORT_TEMPLATES,
  IMPORT_TEMPLATE_NAMES,
  siToUs,
  usToSi,
  type CellType,
  type ColumnUnit,
  type ImportColumn,
  type ImportTemplate,
  type ImportTemplateName,
  type UsAlternative,
} from './columns';
export type { RawCell } from './cells';
export {
  priorRatingImport,
  type FindingImport,
  type GirderImport,
  type ImportBodies,
  type PriorRatingImport,
  type SpanImport,
  type StrandRowImport,
  type StructureImport,
} from './bodies';
export { convertRow, readHeaders, type ConvertedRow, type HeaderReading, type ImportProblem, type ParsedRow, type RowConversion } from './rows';
export {
  checkUpload,
  girderKey,
  spanKey,
  spanOfKey,
  structureKey,
  type AnyConvertedRow,
  type GirderReference,
  type GirderStrandRows,
  type SpanReference,
  type UploadCheck,
} from './upload-checks';
export { addTemplateSheets, allColumnsMarkdown, templateColumnsMarkdown, templateCsv } from './templates';
export { IMPORT_PROBLEMS_LISTED, IMPORT_STATES, importStep, IMPORT_STATE_NAMES, type ImportCounts, type ImportDetail, type ImportState, type ImportSummary } from './api';
export { COLUMNS_SHEET_NAME, IMPORT_ACTION_OF, templateNamed, templateOfFileName, templatesUserMayImport } from './rights';
