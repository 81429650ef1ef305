import type { Browser, Locator, Page } from 'playwright-core';
import { APP_URL_VARIABLE, JOURNEY_IMPORT_BACKGROUND_FROM_BYTES } from '../support/browser-global-setup';
import { launchBrowser, recordPageErrors, saveScreenshot, signInThroughProvider } from '../support/browser';
import {
  GIRDERS_PER_SPAN,
  INVENTORY_SHEETS,
  SPANS_PER_STRUCTURE,
  STRUCTURE_NUMBER_PREFIX,
  journeyRecords,
  recordsWithMistakes,
  workbookBytes,
  type ExpectedProblem,
  type JourneyRecords,
} from '../support/import-journey-workbook';

const appUrl = () => {
  const url = process.env[APP_URL_VARIABLE];
  if (!url) throw new Error(`${APP_URL_VARIABLE} is not set: run this suite through jest's browser project`);
  return url;
};

/** Demo staff: a rater of East and South District, who may add structures to East District. */
const EAST_RATER = 'bv-staff-2029';
const DESK = { width: 1366, height: 960 };
const FILE_NAME = 'east-district-extension.xlsx';
const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';
/** A commit of a few hundred girders takes seconds; the journey's own budget is well above that. */
const JOURNEY_TIMEOUT_MS = 120_000;

/** Polls a condition in the page, since the zoneless app renders after its data arrives. */
async function eventually<T>(read: () => Promise<T>, accept: (value: T) => boolean, what: string, attempts = 100): Promise<T> {
  let last: T | undefined;
  for (let attempt = 0; attempt < attempts; attempt += 1) {
    last = await read();
    if (accept(last)) return last;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error(`${what} did not happen; last seen: ${JSON.stringify(last)}`);
}

/** The problems the page lists, a line each, as sheet, row, column and value. */
const listedProblems = (page: Page) =>
  page.getByTestId('import-problem-row').evaluateAll((rows) =>
    rows.map((row) => {
      const [sheet, rowNumber, column, value] = [...row.querySelectorAll('td')].map((cell) => (cell.textContent ?? '').trim());
      return { sheet, row: Number(rowNumber), column, value };
    }),
  );

/** The check's counts table: per template, rows, new, changed, unchanged and refused as the page writes them. */
const listedCounts = (page: Page) =>
  page.getByTestId('import-count-row').evaluateAll((rows) =>
    Object.fromEntries(rows.map((row) => [row.getAttribute('data-template'), [...row.querySelectorAll('td')].slice(1).map((cell) => (cell.textContent ?? '').trim())])),
  );

type ProblemPlace = Pick<ExpectedProblem, 'row' | 'column' | 'value'> & { readonly sheet: string };
/** A count as the page writes it, with thousands separated: "1,200". */
const asWritten = (count: number) => count.toLocaleString('en');

const byPlace = (a: ProblemPlace, b: ProblemPlace) => a.sheet.localeCompare(b.sheet) || a.row - b.row || a.column.localeCompare(b.column);

/** The check of one import, once the page shows it in the given state. */
async function checkOf(page: Page, state: string, notId?: number): Promise<{ id: number; check: Locator }> {
  const check = page.locator(`[data-testid="import-check"][data-state="${state}"]${notId === undefined ? '' : `:not([data-import-id="${notId}"])`}`);
  await check.waitFor({ timeout: 30_000 });
  const id = Number(await check.getAttribute('data-import-id'));
  await page.waitForURL(new RegExp(`/imports/${id}$`));
  return { id, check };
}

async function uploadWorkbook(page: Page, bytes: Buffer): Promise<void> {
  await page.getByTestId('import-file-input').setInputFiles({ name: FILE_NAME, mimeType: XLSX_TYPE, buffer: bytes });
  await page.getByTestId('chosen-file').filter({ hasText: FILE_NAME }).waitFor();
  // An XLSX names its templates by its sheets: no template is asked for.
  expect(await page.locator('[data-testid="import-template"]').count()).toBe(0);
  await page.getByTestId('upload-file').click();
}

describe('imports journey', () => {
  let browser: Browser;
  let clean: JourneyRecords;
  let cleanBytes: Buffer;
  let firstTry: { bytes: Buffer; problems: ExpectedProblem[] };

  beforeAll(async () => {
    browser = await launchBrowser();
    clean = journeyRecords();
    cleanBytes = await workbookBytes(clean);
    const withMistakes = recordsWithMistakes(clean);
    firstTry = { bytes: await workbookBytes(withMistakes.records), problems: withMistakes.problems };
  });
  afterAll(() => browser.close());

  it(
    'a rater uploads an XLSX, sees its problems by sheet, row and column, uploads the fixed file, commits it with a progress bar, and finds the new structures on the map',
    async () => {
      // The fixed file must be one the server commits in the background, where the progress bar is shown.
      expect(cleanBytes.length).toBeGreaterThanOrEqual(JOURNEY_IMPORT_BACKGROUND_FROM_BYTES);
      const structureNumbers = clean.structures.map((structure) => String(structure['structure_number']));
      const rowCount = INVENTORY_SHEETS.reduce((sum, sheet) => sum + clean[sheet].length, 0);

      const page = await browser.newPage({ viewport: DESK });
      const pageErrors = recordPageErrors(page);
      await signInThroughProvider(page, appUrl(), EAST_RATER, '/');
      await page.getByTestId('nav-imports').click();
      await page.waitForURL(/\/imports$/);
      await page.getByTestId('import-drop-zone').waitFor();
      expect(await page.locator('[data-testid="template-download"][data-template="girders"]').getByTestId('template-xlsx').count()).toBe(1);
      await saveScreenshot(page, 'imports-1-page');

      // First try: the file with its mistakes. Each is listed by sheet, row, column and the value the file held.
      await uploadWorkbook(page, firstTry.bytes);
      const first = await checkOf(page, 'checked');
      await first.check.getByTestId('import-problem-row').first().waitFor();
      const listed = await listedProblems(page);
      expect([...listed].sort(byPlace)).toEqual([...firstTry.problems].sort(byPlace));
      expect(await first.check.getByTestId('problems-heading').textContent()).toContain(`${firstTry.problems.length} problems`);
      // Each row with a problem is counted refused once, in its template.
      const countCells = Object.values(await listedCounts(page)) as string[][];
      const refusedCounted = countCells.reduce((sum, cells) => sum + Number(cells[4]!.replace(/,/g, '')), 0);
      expect(refusedCounted).toBe(new Set(firstTry.problems.map((problem) => `${problem.sheet}/${problem.row}`)).size);
      expect(await first.check.getByTestId('commit-blocked').textContent()).toMatch(/Fix the file and upload it again/);
      expect(await first.check.getByTestId('commit-import').count()).toBe(0);
      const messages = await page.getByTestId('import-problem-row').evaluateAll((rows) => rows.map((row) => (row.querySelectorAll('td')[4]?.textContent ?? '').trim()));
      expect(messages.join('\n')).toMatch(/-90 to 90/);
      expect(messages.join('\n')).toMatch(/not a girder type of the catalogue/);
      expect(messages.join('\n')).toMatch(/span is not in the register, and no valid spans row of this file adds it/);
      await saveScreenshot(page, 'imports-2-check-with-problems');
      await first.check.getByTestId('import-problems').scrollIntoViewIfNeeded();
      await saveScreenshot(page, 'imports-3-problem-list');

      // The error report has a line for every problem, under a header line. The link is read as the
      // browser resolves it, against the app's base href.
      const reportUrl = await first.check.getByTestId('problems-report-link').evaluate((link) => (link as HTMLAnchorElement).href);
      const report = await page.request.get(reportUrl);
      expect(report.status()).toBe(200);
      expect((await report.text()).trim().split(/\r\n/)).toHaveLength(firstTry.problems.length + 1);

      // The fixed file, saved under the same name: a clean check, with what it would add.
      await uploadWorkbook(page, cleanBytes);
      const fixed = await checkOf(page, 'checked', first.id);
      await fixed.check.getByTestId('commit-ready').waitFor();
      expect(await fixed.check.getByTestId('import-problem-row').count()).toBe(0);
      const girderCount = clean.girders.length;
      expect(girderCount).toBe(structureNumbers.length * SPANS_PER_STRUCTURE * GIRDERS_PER_SPAN);
      // Strand rows replace a girder's rows as a whole, so they are counted once per girder.
      expect(await listedCounts(page)).toEqual({
        structures: [asWritten(clean.structures.length), asWritten(clean.structures.length), '0', '0', '0'],
        spans: [asWritten(clean.spans.length), asWritten(clean.spans.length), '0', '0', '0'],
        girders: [asWritten(girderCount), asWritten(girderCount), '0', '0', '0'],
        'strand-rows': [asWritten(clean['strand-rows'].length), asWritten(girderCount), '0', '0', '0'],
      });
      await saveScreenshot(page, 'imports-4-clean-check');

      // Commit: the server takes it as a background job (202) and the page follows its progress.
      const commitAnswer = page.waitForResponse((response) => response.url().endsWith(`/api/imports/${fixed.id}/commit`) && response.request().method() === 'POST');
      await fixed.check.getByTestId('commit-import').click();
      expect((await commitAnswer).status()).toBe(202);
      const committing = page.locator(`[data-testid="import-check"][data-import-id="${fixed.id}"][data-state="committing"]`);
      const bar = committing.getByTestId('commit-progress');
      await bar.waitFor({ state: 'visible' });
      await saveScreenshot(page, 'imports-5-committing');
      // The bar stands where its words say, for those who hear it rather than see it.
      const firstWords = (await committing.getByTestId('commit-progress-text').textContent())!;
      expect(await bar.getAttribute('aria-valuenow')).toBe(/\((\d+) %\)/.exec(firstWords)?.[1]);
      const progressSeen: string[] = [];
      await eventually(
        async () => {
          const text = await committing.getByTestId('commit-progress-text').textContent({ timeout: 100 }).catch(() => null);
          if (text !== null && progressSeen.at(-1) !== text.trim()) progressSeen.push(text.trim());
          return page.locator(`[data-testid="import-check"][data-import-id="${fixed.id}"]`).getAttribute('data-state');
        },
        (state) => state !== 'committing',
        'the commit to end',
        600,
      );
      expect(progressSeen.length).toBeGreaterThan(0);
      for (const text of progressSeen) expect(text).toMatch(new RegExp(`^Importing: [\\d,]+ of ${asWritten(rowCount)} rows written \\(\\d+ %\\)$`));

      const done = page.locator(`[data-testid="import-check"][data-import-id="${fixed.id}"][data-state="committed"]`);
      await done.waitFor();
      expect(await done.getByTestId('import-committed').textContent()).toContain(`Structures: ${structureNumbers.length} new`);
      const historyRow = page.locator(`[data-testid="import-history-row"][data-import-id="${fixed.id}"]`);
      await eventually(() => historyRow.getAttribute('data-state'), (state) => state === 'committed', 'the history to show the import committed');
      expect(await page.locator(`[data-testid="import-history-row"][data-import-id="${first.id}"]`).getAttribute('data-state')).toBe('checked');
      // Its number first, as the check and a refusal of the same bytes name it.
      expect((await historyRow.locator('td').first().textContent())?.trim()).toBe(String(fixed.id));
      await saveScreenshot(page, 'imports-6-committed');

      // On the network map: the new structures' spans are due for re-rating; a search finds them all.
      await done.getByTestId('open-network-map').click();
      await page.waitForURL(/reratingDue=true/);
      await page.getByTestId('filter-search').fill(STRUCTURE_NUMBER_PREFIX);
      const found = await eventually(
        () => page.getByTestId('structure-list-item').evaluateAll((items) => items.map((item) => item.getAttribute('data-structure-number') ?? '')),
        (numbers) => numbers.length > 0 && numbers.every((number) => number.startsWith(STRUCTURE_NUMBER_PREFIX)),
        'the search to list the new structures',
      );
      expect([...found].sort()).toEqual([...structureNumbers].sort());
      await eventually(() => page.getByTestId('network-map').getAttribute('data-marker-count'), (count) => Number(count) === structureNumbers.length, 'the map to show the new structures');
      expect(await page.getByTestId('structure-list-due').count()).toBe(structureNumbers.length);
      await saveScreenshot(page, 'imports-7-map-search');

      const opened = clean.structures[0]!;
      await page.locator(`[data-testid="structure-list-item"][data-structure-number="${opened['structure_number']}"]`).click();
      const card = page.getByTestId('structure-card');
      await card.waitFor();
      expect(await card.getByTestId('structure-card-number').textContent()).toContain(String(opened['structure_number']));
      expect(await card.getByTestId('structure-card-name').textContent()).toContain(String(opened['name']));
      await saveScreenshot(page, 'imports-8-structure-card');

      await card.getByTestId('open-structure').click();
      await page.waitForURL(/\/structures\/\d+$/);
      await eventually(() => page.getByTestId('structure-title').textContent(), (title) => (title ?? '').includes(String(opened['structure_number'])), 'the structure page');
      expect(await page.getByTestId('structure-facts').textContent()).toContain('East District');
      await page.getByTestId('span-row').first().waitFor();
      expect(await page.getByTestId('span-row').count()).toBe(SPANS_PER_STRUCTURE);
      await page.locator('[data-testid="span-row"][data-span-index="1"]').click();
      await page.getByTestId('girder-row').first().waitFor();
      expect(await page.getByTestId('girder-row').count()).toBe(GIRDERS_PER_SPAN);
      await saveScreenshot(page, 'imports-9-structure-page');

      expect(pageErrors).toEqual([]);
      await page.close();
    },
    JOURNEY_TIMEOUT_MS,
  );
});
