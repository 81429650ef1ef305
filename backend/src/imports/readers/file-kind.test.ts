import fs from 'node:fs';
import { detectFileKind } from './file-kind';
import { importFailure, useTempFolder } from './test-support/temp-files';
import { writeSampleByHand, writeSampleWithExcelJs } from './test-support/workbooks';
import { writeZip } from './test-support/zip-writer';

const temp = useTempFolder();

/** The first bytes of the formats people upload by mistake (their published magic numbers), then filler. */
const OLE2_MAGIC = [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1];

describe('detectFileKind', () => {
  it('recognises workbooks by their parts, whoever wrote them and whatever their name', async () => {
    const byExcelJs = temp.file('named-as.csv');
    await writeSampleWithExcelJs(byExcelJs);
    const byHand = temp.file('no-extension');
    await writeSampleByHand(byHand);
    expect(await detectFileKind(byExcelJs)).toBe('xlsx');
    expect(await detectFileKind(byHand)).toBe('xlsx');
  });

  it('recognises UTF-8 text as CSV, with or without a BOM, even when named .xlsx', async () => {
    const file = temp.file('text.xlsx');
    fs.writeFileSync(file, '\uFEFFgirder_key\nG-1\n');
    expect(await detectFileKind(file)).toBe('csv');
  });

  it.each([
    ['legacy.xls', Buffer.from([...OLE2_MAGIC, 0, 0, 0, 0]), 'legacy Excel workbook (.xls)'],
    ['report.csv', Buffer.from('%PDF-1.7\n%âãÏÓ\n'), 'a PDF document'],
    ['image.csv', Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), 'a PNG image'],
    ['binary.csv', Buffer.from([0x67, 0x69, 0x72, 0x00, 0x01, 0x02]), 'a binary file'],
    ['latin1.csv', Buffer.from([0x63, 0x61, 0x66, 0xe9, 0x0a]), 'not UTF-8'],
    ['utf16.csv', Buffer.from('\uFEFFkey', 'utf16le'), 'UTF-16'],
    ['empty.csv', Buffer.alloc(0), 'an empty file'],
  ])('refuses %s by its content, naming what it is', async (name, bytes, named) => {
    const file = temp.file(name);
    fs.writeFileSync(file, bytes);
    const error = await importFailure(detectFileKind(file));
    expect(error.code).toBe('unsupported_file');
    expect(error.message).toContain(named);
  });

  it('refuses a zip that is not a workbook, naming a Word document when it is one', async () => {
    const docx = temp.file('letter.xlsx');
    await writeZip(docx, [
      { name: '[Content_Types].xml', data: '<Types/>' },
      { name: 'word/document.xml', data: '<document/>' },
    ]);
    const plainZip = temp.file('photos.xlsx');
    await writeZip(plainZip, [{ name: 'photo-list.txt', data: 'girder 1' }]);
    expect((await importFailure(detectFileKind(docx))).message).toContain('a Word document');
    expect((await importFailure(detectFileKind(plainZip))).message).toContain('holds no Excel workbook');
  });

  it('reports a truncated zip as a file that cannot be read', async () => {
    const whole = temp.file('whole.xlsx');
    await writeSampleByHand(whole);
    const truncated = temp.file('truncated.xlsx');
    fs.writeFileSync(truncated, fs.readFileSync(whole).subarray(0, 200));
    expect(await importFailure(detectFileKind(truncated))).toMatchObject({ code: 'corrupt_file' });
  });
});
