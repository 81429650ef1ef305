import { readAllRows, importFailure, useTempFolder } from './test-support/temp-files';
import { minimalWorkbookParts, writeSampleByHand, writeSampleWithExcelJs } from './test-support/workbooks';
import { ZipFileWriter, writeDeflatedZeros } from './test-support/zip-writer';
import { checkXlsxSafety } from './xlsx-safety';
import fs from 'node:fs';
import zlib from 'node:zlib';
import { XlsxZipParts } from './xlsx-zip-parts';

const temp = useTempFolder();
const MB = 1024 * 1024;
const GB = 1024 * MB;

/** The parts a reader needs to call the file a workbook, with `sheetName` left for the test to add. */
async function startWorkbookZip(filePath: string): Promise<ZipFileWriter> {
  const parts = minimalWorkbookParts('');
  const zip = new ZipFileWriter(filePath);
  await zip.addPart('[Content_Types].xml', parts.contentTypes);
  await zip.addPart('_rels/.rels', parts.packageRels);
  await zip.addPart('xl/workbook.xml', parts.workbook);
  await zip.addPart('xl/_rels/workbook.xml.rels', parts.workbookRels);
  return zip;
}

describe('checkXlsxSafety', () => {
  it('passes workbooks written by exceljs and by hand', async () => {
    const byExcelJs = temp.file('ok-exceljs.xlsx');
    const byHand = temp.file('ok-by-hand.xlsx');
    await writeSampleWithExcelJs(byExcelJs);
    await writeSampleByHand(byHand);
    await expect(checkXlsxSafety(byExcelJs)).resolves.toBeUndefined();
    await expect(checkXlsxSafety(byHand)).resolves.toBeUndefined();
  });

  it('refuses a zip bomb (1 GB of zeros in one sheet) before the spreadsheet reader opens it, in bounded memory', async () => {
    const file = temp.file('bomb.xlsx');
    const zip = await startWorkbookZip(file);
    await zip.addDeflatedZeros('xl/worksheets/sheet1.xml', GB);
    await zip.finish();
    const openWorkbook = jest.spyOn(XlsxZipParts, 'open');
    const rssBefore = process.memoryUsage().rss;

    const error = await importFailure(readAllRows(file));

    const rssAfter = process.memoryUsage().rss;
    console.log(`zip bomb of ${fs.statSync(file).size} bytes refused; rss ${Math.round(rssBefore / MB)} MB → ${Math.round(rssAfter / MB)} MB`);
    expect(error.code).toBe('zip_bomb');
    expect(openWorkbook).not.toHaveBeenCalled();
    // Inflating the sheet would take 1 GB; reading the directory takes kilobytes.
    expect(rssAfter - rssBefore).toBeLessThan(64 * MB);
    openWorkbook.mockRestore();
  }, 60_000);

  it('refuses a part that declares 1 KB but inflates to 1 GB, before the spreadsheet reader opens it, in bounded memory', async () => {
    const payload = temp.file('lying-zeros.deflate');
    const file = temp.file('lying-bomb.xlsx');
    const truth = await writeDeflatedZeros(payload, GB);
    const zip = await startWorkbookZip(file);
    // The true CRC, so that only the size lies: the refusal must come from counting, not from the checksum.
    await zip.addDeflatedFile('xl/worksheets/sheet1.xml', payload, { crc: truth.crc, uncompressedSize: 1024 });
    await zip.finish();
    const openWorkbook = jest.spyOn(XlsxZipParts, 'open');
    const rssBefore = process.memoryUsage().rss;

    const error = await importFailure(readAllRows(file));

    const rssAfter = process.memoryUsage().rss;
    console.log(`zip declaring 1 KB, holding 1 GB (${fs.statSync(file).size} bytes) refused; rss ${Math.round(rssBefore / MB)} MB → ${Math.round(rssAfter / MB)} MB`);
    expect(error.code).toBe('zip_bomb');
    expect(openWorkbook).not.toHaveBeenCalled();
    // Inflating the sheet in full would take 1 GB; the counter keeps none of it and stops after the first kilobytes.
    expect(rssAfter - rssBefore).toBeLessThan(64 * MB);
    openWorkbook.mockRestore();
  }, 120_000);

  it.each([
    ['deflated', true],
    ['stored', false],
  ])('refuses a %s part whose checksum does not match its content', async (_method, deflate) => {
    const file = temp.file('wrong-crc.xlsx');
    const sheet = minimalWorkbookParts('').sheet;
    const zip = await startWorkbookZip(file);
    await zip.addPart('xl/worksheets/sheet1.xml', sheet, { deflate, declaredCrc: (zlib.crc32(sheet) ^ 1) >>> 0 });
    await zip.finish();
    const error = await importFailure(checkXlsxSafety(file));
    expect(error).toMatchObject({ code: 'corrupt_file' });
    expect(error.message).toContain('checksum');
  });

  it('refuses a part that unpacks to fewer bytes than it declares', async () => {
    const file = temp.file('short.xlsx');
    const sheet = minimalWorkbookParts('').sheet;
    const zip = await startWorkbookZip(file);
    await zip.addPart('xl/worksheets/sheet1.xml', sheet, { declaredUncompressedSize: Buffer.byteLength(sheet) + 1 });
    await zip.finish();
    const error = await importFailure(checkXlsxSafety(file));
    expect(error).toMatchObject({ code: 'corrupt_file' });
    expect(error.message).toContain('fewer bytes');
  });

  it('refuses a part with bytes after the end of its deflate stream', async () => {
    const file = temp.file('trailing.xlsx');
    const zip = await startWorkbookZip(file);
    await zip.addPart('xl/worksheets/sheet1.xml', minimalWorkbookParts('').sheet, { trailingBytes: Buffer.from('unchecked') });
    await zip.finish();
    const error = await importFailure(checkXlsxSafety(file));
    expect(error).toMatchObject({ code: 'corrupt_file' });
    expect(error.message).toContain('after its compressed data');
  });

  it('refuses a part whose deflate data is damaged', async () => {
    const file = temp.file('damaged.xlsx');
    await writeSampleByHand(file);
    const bytes = fs.readFileSync(file);
    // Block type 3 is reserved in deflate (RFC 1951, 3.2.3): the first block of the first part can no longer be read.
    const firstDataAt = 30 + bytes.readUInt16LE(26) + bytes.readUInt16LE(28);
    bytes[firstDataAt] = bytes[firstDataAt]! | 0b110;
    fs.writeFileSync(file, bytes);
    const error = await importFailure(checkXlsxSafety(file));
    expect(error).toMatchObject({ code: 'corrupt_file' });
    expect(error.message).toContain('cannot be unpacked');
  });

  it('refuses a workbook whose parts unpack past the size cap', async () => {
    const file = temp.file('large.xlsx');
    await writeSampleWithExcelJs(file);
    const error = await importFailure(checkXlsxSafety(file, { maxTotalUncompressedBytes: 1000 }));
    expect(error.code).toBe('file_too_large_uncompressed');
  });

  it('refuses a workbook with too many parts', async () => {
    const file = temp.file('many-parts.xlsx');
    await writeSampleWithExcelJs(file);
    expect(await importFailure(checkXlsxSafety(file, { maxEntries: 3 }))).toMatchObject({ code: 'too_many_entries' });
  });

  it('refuses encrypted parts', async () => {
    const file = temp.file('encrypted.xlsx');
    const zip = await startWorkbookZip(file);
    await zip.addPart('xl/worksheets/sheet1.xml', '<worksheet/>', { flags: 0x0001 });
    await zip.finish();
    expect(await importFailure(checkXlsxSafety(file))).toMatchObject({ code: 'encrypted_file' });
  });

  it.each(['../../etc/cron.d/job', 'xl/../../outside.xml', '/absolute.xml', 'C:/windows.xml', 'xl\\..\\..\\back.xml'])(
    'refuses a part named %s',
    async (name) => {
      const file = temp.file('escaping.xlsx');
      const zip = await startWorkbookZip(file);
      await zip.addPart(name, '<x/>');
      await zip.finish();
      expect(await importFailure(checkXlsxSafety(file))).toMatchObject({ code: 'unsafe_entry_path' });
    },
  );

  it('refuses a workbook whose local header names a part other than its directory entry', async () => {
    const file = temp.file('renamed-locally.xlsx');
    await writeSampleByHand(file);
    const bytes = fs.readFileSync(file);
    // The first occurrence is the local header (the directory comes last): the streaming reader would see sheet9.
    const localName = bytes.indexOf('xl/worksheets/sheet1.xml');
    bytes.write('9', localName + 'xl/worksheets/sheet'.length);
    fs.writeFileSync(file, bytes);
    expect(await importFailure(checkXlsxSafety(file))).toMatchObject({ code: 'corrupt_file' });
  });

  it('refuses a workbook with bytes in front of its first entry', async () => {
    const file = temp.file('prefixed.xlsx');
    await writeSampleByHand(file);
    fs.writeFileSync(file, Buffer.concat([Buffer.from('PK\x03\x04 unlisted data'), fs.readFileSync(file)]));
    expect(await importFailure(checkXlsxSafety(file))).toMatchObject({ code: 'corrupt_file' });
  });

  it('lets a generous ratio limit pass what the default refuses', async () => {
    const file = temp.file('repetitive.xlsx');
    const zip = await startWorkbookZip(file);
    await zip.addDeflatedZeros('xl/media/blank.bin', 2 * MB);
    await zip.finish();
    expect(await importFailure(checkXlsxSafety(file))).toMatchObject({ code: 'zip_bomb' });
    await expect(checkXlsxSafety(file, { maxCompressionRatio: 10_000 })).resolves.toBeUndefined();
  });
});
