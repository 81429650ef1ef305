import { IMPORT_TEMPLATES, IMPORT_TEMPLATE_NAMES, type ImportTemplateName } from './columns';
import { convertRow, readHeaders, type ParsedRow } from './rows';

/** The template's example row, with some cells changed or left out (`undefined`). */
function exampleCells(name: ImportTemplateName, changes: Record<string, string | number | boolean | Date | null | undefined> = {}) {
  const cells: Record<string, string | number | boolean | Date | null> = {};
  for (const column of IMPORT_TEMPLATES[name].columns) cells[column.header] = column.example;
  for (const [header, value] of Object.entries(changes)) {
    if (value === undefined) delete cells[header];
    else cells[header] = value;
  }
  return cells;
}

function convert<T extends ImportTemplateName>(name: T, cells: ParsedRow['cells'], rowNumber = 2) {
  const headers = readHeaders(name, name, Object.keys(cells));
  expect(headers.problems).toEqual([]);
  return convertRow(name, headers, { sheet: name, rowNumber, cells });
}

function problemsOf(name: ImportTemplateName, cells: ParsedRow['cells'], rowNumber = 2) {
  const result = convert(name, cells, rowNumber);
  if (result.ok) throw new Error('expected the row to be refused');
  return result.problems;
}

describe('a good row of each template', () => {
  it.each(IMPORT_TEMPLATE_NAMES)('%s: the example row converts and passes the API schema', (name) => {
    const result = convert(name, exampleCells(name));
    expect(result.ok).toBe(true);
  });

  it('structures: the row becomes the body of POST /api/structures', () => {
    const result = convert('structures', exampleCells('structures', { notes: undefined, status: undefined, skew_deg: undefined }));
    if (!result.ok) throw new Error(JSON.stringify(result.problems));
    expect(result.row.body).toMatchObject({ structureNumber: 'BV-S-0201', longitude: -96.512, yearBuilt: 1978, adtt: 410, status: 'open', skewDeg: 0, notes: '' });
  });

  it('spans: lists and the wearing surface are assembled, and no stand-in version is left', () => {
    const result = convert('spans', exampleCells('spans'));
    if (!result.ok) throw new Error(JSON.stringify(result.problems));
    expect(result.row.body.span).toMatchObject({ lengthM: 24.4, barriers: [{ loadKnM: 7.2 }, { loadKnM: 7.2 }], wearingSurface: { thicknessMm: 50, measured: false, kind: 'overlay' } });
    expect(result.row.body.span).not.toHaveProperty('version');
  });

  it('girders: a catalogue type by name, or a custom I-girder by its dimensions', () => {
    const named = convert('girders', exampleCells('girders'));
    if (!named.ok) throw new Error(JSON.stringify(named.problems));
    expect(named.row.body.girderTypeName).toBe('AASHTO Type III I-girder');
    expect(named.row.body.record).not.toHaveProperty('girderTypeId');
    expect(named.row.body.record).not.toHaveProperty('strandRows');
    expect(named.row.body.record.customSection).toBeNull();

    // Dimensions invented for the test, chosen to satisfy the shape's rules (web left between flanges and tapers).
    const custom = convert('girders', exampleCells('girders', {
      girder_type: '',
      section_shape: 'i-girder',
      section_depth_mm: 1100,
      section_web_width_mm: 180,
      section_top_flange_width_mm: 400,
      section_top_flange_thickness_mm: 100,
      section_top_taper_height_mm: 75,
      section_bottom_flange_width_mm: 550,
      section_bottom_flange_thickness_mm: 180,
      section_bottom_taper_height_mm: 150,
    }));
    if (!custom.ok) throw new Error(JSON.stringify(custom.problems));
    expect(custom.row.body.girderTypeName).toBeNull();
    expect(custom.row.body.record.customSection).toEqual({
      shape: 'i-girder', depthMm: 1100, webWidthMm: 180, topFlangeWidthMm: 400, topFlangeThicknessMm: 100, topTaperHeightMm: 75,
      bottomFlangeWidthMm: 550, bottomFlangeThicknessMm: 180, bottomTaperHeightMm: 150,
    });
  });

  it('findings: strands by count, and a spreadsheet date cell for the inspection', () => {
    const result = convert('findings', exampleCells('findings', { strand_indices: '', strand_count: 2, inspected_on: new Date(Date.UTC(2025, 5, 12)) }));
    if (!result.ok) throw new Error(JSON.stringify(result.problems));
    expect(result.row.body.inspectedOn).toBe('2025-06-12');
    expect(result.row.body.finding.strands).toEqual({ rowId: 'R1', count: 2 });
    expect(result.row.body.finding).not.toHaveProperty('girderId');
  });

  it('prior ratings: the span may be left empty for the whole structure', () => {
    const result = convert('prior-ratings', exampleCells('prior-ratings', { span_index: '' }));
    if (!result.ok) throw new Error(JSON.stringify(result.problems));
    expect(result.row.body).toMatchObject({ spanIndex: null, lowestLegalRatingFactor: 1.12 });
  });
});

describe('US customary headers', () => {
  // Hand check from the published conversion factors in units.ts: 1 ft = 0.3048 m, 1 in = 25.4 mm,
  // 1 ksi = 6.894757 MPa, 1 kip = 4.448222 kN, so 1 kip/ft = 4.448222 / 0.3048 kN/m.
  it('spans: ft and in give the same SI body as m and mm', () => {
    const us = convert('spans', exampleCells('spans', {
      span_length_m: undefined, span_length_ft: 80,
      girder_spacing_mm: undefined, girder_spacing_in: 96,
      roadway_width_mm: undefined, roadway_width_ft: 36,
      barrier_loads_kn_m: undefined, barrier_loads_kip_ft: '0.5;0.5',
    }));
    const si = convert('spans', exampleCells('spans', { span_length_m: 24.384, girder_spacing_mm: 2438.4, roadway_width_mm: 10972.8, barrier_loads_kn_m: '7.297;7.297' }));
    if (!us.ok || !si.ok) throw new Error('both rows should convert');
    expect(us.row.body.span.lengthM).toBeCloseTo(si.row.body.span.lengthM!, 9);
    expect(us.row.body.span.girderSpacingMm).toBeCloseTo(si.row.body.span.girderSpacingMm!, 9);
    expect(us.row.body.span.roadwayWidthMm).toBeCloseTo(si.row.body.span.roadwayWidthMm!, 9);
    expect(us.row.body.span.barriers![0]!.loadKnM).toBeCloseTo(si.row.body.span.barriers![0]!.loadKnM, 3);
  });

  it('strand rows: in, in² and ksi give the same SI body as mm, mm² and MPa', () => {
    const us = convert('strand-rows', {
      ...exampleCells('strand-rows', { y_mm: undefined, strand_area_mm2: undefined, strand_diameter_mm: undefined, fpu_mpa: undefined, fpy_mpa: undefined, eps_mpa: undefined, fpe_mpa: undefined }),
      y_in: 2, strand_area_in2: 0.153, strand_diameter_in: 0.5, fpu_ksi: 270, fpy_ksi: 243, eps_ksi: 28500, fpe_ksi: 160,
    });
    // 2 × 25.4; 0.153 × 25.4²; 0.5 × 25.4; 270, 243, 28500 and 160 × 6.894757.
    const expected = { yMm: 50.8, strandAreaMm2: 98.70948, strandDiameterMm: 12.7, fpuMpa: 1861.58439, fpyMpa: 1675.425951, epsMpa: 196500.5745, fpeMpa: 1103.16112 };
    if (!us.ok) throw new Error(JSON.stringify(us.problems));
    for (const [key, value] of Object.entries(expected)) expect(us.row.body.strandRow[key as keyof typeof expected]).toBeCloseTo(value, 4);
  });

  it('a limit is checked after conversion, and the message says so', () => {
    const problems = problemsOf('spans', exampleCells('spans', { span_length_m: undefined, span_length_ft: 1000 }));
    expect(problems).toEqual([{ sheet: 'spans', row: 2, column: 'span_length_ft', value: 1000, message: 'must be at most 300 m (checked after conversion to m)' }]);
  });
});

describe('bad cells are named by sheet, row, column and value', () => {
  it('a number column holding text', () => {
    expect(problemsOf('spans', exampleCells('spans', { girder_spacing_mm: '2,400' }), 7)).toEqual([
      { sheet: 'spans', row: 7, column: 'girder_spacing_mm', value: '2,400', message: 'expected a number' },
    ]);
  });

  it('a required cell left empty', () => {
    expect(problemsOf('structures', exampleCells('structures', { district: '  ' }))).toEqual([
      { sheet: 'structures', row: 2, column: 'district', value: '  ', message: 'is required' },
    ]);
  });

  it('a value out of the schema’s range', () => {
    expect(problemsOf('structures', exampleCells('structures', { latitude_deg: 95 }))).toEqual([
      { sheet: 'structures', row: 2, column: 'latitude_deg', value: 95, message: 'must be -90 to 90' },
    ]);
  });

  it('a choice not in the list', () => {
    expect(problemsOf('structures', exampleCells('structures', { status: 'shut' }))).toEqual([
      { sheet: 'structures', row: 2, column: 'status', value: 'shut', message: 'expected one of: open, posted, closed' },
    ]);
  });

  it('a date not in YYYY-MM-DD, and a bare day number', () => {
    expect(problemsOf('prior-ratings', exampleCells('prior-ratings', { approved_on: '08/03/2019' }))).toEqual([
      { sheet: 'prior-ratings', row: 2, column: 'approved_on', value: '08/03/2019', message: 'expected a date YYYY-MM-DD' },
    ]);
    expect(problemsOf('prior-ratings', exampleCells('prior-ratings', { approved_on: 43532 }))[0]).toMatchObject({ column: 'approved_on', value: 43532 });
  });

  it('a fraction in a whole-number column, and a bad list item', () => {
    const problems = problemsOf('findings', exampleCells('findings', { span_index: 1.5, strand_indices: '0;x' }));
    expect(problems).toEqual([
      { sheet: 'findings', row: 2, column: 'span_index', value: 1.5, message: 'expected a whole number' },
      { sheet: 'findings', row: 2, column: 'strand_indices', value: '0;x', message: 'item 2 ("x"): expected a whole number; separate items with ";"' },
    ]);
  });

  it('empty list items are passed over, and not counted when a bad item is named', () => {
    expect(problemsOf('findings', exampleCells('findings', { strand_indices: '0;;x;' }))).toEqual([
      { sheet: 'findings', row: 2, column: 'strand_indices', value: '0;;x;', message: 'item 2 ("x"): expected a whole number; separate items with ";"' },
    ]);
  });

  it('a rule between fields is put on the column the schema names', () => {
    expect(problemsOf('structures', exampleCells('structures', { adt: 300, adtt: 410 }))).toEqual([
      { sheet: 'structures', row: 2, column: 'adtt', value: 410, message: 'truck traffic cannot exceed all traffic (ADT)' },
    ]);
    expect(problemsOf('findings', exampleCells('findings', { from_m: 5, to_m: 4.1 }))).toEqual([
      { sheet: 'findings', row: 2, column: 'to_m', value: 4.1, message: 'must not be before "from"' },
    ]);
  });

  it('a finding kind missing what it needs, or carrying what it does not use', () => {
    expect(problemsOf('findings', exampleCells('findings', { kind: 'spall', spall_depth_mm: 40 }))).toEqual([
      { sheet: 'findings', row: 2, column: 'spall_width_mm', value: '', message: 'is needed here, but the cell is empty' },
    ]);
    expect(problemsOf('findings', exampleCells('findings', { kind: 'spall', spall_depth_mm: 40, spall_width_mm: 300 }))).toEqual([
      { sheet: 'findings', row: 2, column: 'strand_row_id', value: 'R1', message: 'a spall finding does not use it' },
    ]);
  });

  it('girders: a dimension the section shape does not use, dimensions without a shape, and no section at all', () => {
    const rectangle = { girder_type: '', section_shape: 'rectangle', section_width_mm: 900, section_depth_mm: 500 };
    expect(problemsOf('girders', exampleCells('girders', { ...rectangle, section_flange_width_mm: 1200 }))).toEqual([
      { sheet: 'girders', row: 2, column: 'section_flange_width_mm', value: 1200, message: 'this section shape does not use it; leave it empty' },
    ]);
    expect(problemsOf('girders', exampleCells('girders', { ...rectangle, section_shape: '' }))).toEqual([
      { sheet: 'girders', row: 2, column: 'section_shape', value: null, message: 'section dimensions are given: choose the section shape they belong to (rectangle, tee or i-girder)' },
    ]);
    expect(problemsOf('girders', exampleCells('girders', { girder_type: '' }))).toEqual([
      { sheet: 'girders', row: 2, column: 'section_shape', value: '', message: 'give a custom section, or choose a girder type' },
    ]);
  });

  it('prior ratings: neither rating factor given', () => {
    expect(problemsOf('prior-ratings', exampleCells('prior-ratings', { lowest_legal_rf: '', design_inventory_rf: '' }))).toEqual([
      { sheet: 'prior-ratings', row: 2, column: 'lowest_legal_rf', value: '', message: 'give the lowest legal rating factor, the design inventory one, or both' },
    ]);
  });
});

describe('header rules', () => {
  const headers = IMPORT_TEMPLATES.spans.columns.map((column) => column.header);

  it('an unknown header is a problem at that header', () => {
    const reading = readHeaders('spans', 'Spans', [...headers, 'span_colour'], 3);
    expect(reading.problems).toEqual([
      { sheet: 'Spans', row: 3, column: 'span_colour', value: 'span_colour', message: 'unknown column for spans; data-import/README.md lists the columns' },
    ]);
  });

  it('a header given twice, or both unit systems of one column, is a problem', () => {
    const reading = readHeaders('spans', 'Spans', [...headers, 'Span_Length_M ', 'span_length_ft']);
    expect(reading.problems).toEqual([
      { sheet: 'Spans', row: 1, column: 'Span_Length_M ', value: 'Span_Length_M ', message: 'the column appears twice' },
      { sheet: 'Spans', row: 1, column: 'span_length_ft', value: 'span_length_ft', message: 'give span_length_m or span_length_ft, not both' },
    ]);
  });

  it('the required columns missing are one problem for the sheet, not one per row', () => {
    const present = headers.filter((header) => header !== 'span_length_m' && header !== 'deck_thickness_mm');
    const reading = readHeaders('spans', 'Spans', present);
    expect(reading.problems).toEqual([
      { sheet: 'Spans', row: 1, column: 'span_length_m, deck_thickness_mm', value: null, message: 'required columns missing: span_length_m (or span_length_ft), deck_thickness_mm (or deck_thickness_in)' },
    ]);
    const cells = exampleCells('spans', { span_length_m: undefined, deck_thickness_mm: undefined });
    expect(convertRow('spans', reading, { sheet: 'Spans', rowNumber: 2, cells })).toEqual({ ok: false, problems: [] });
  });

  it('a US customary header stands in for a required SI one, and blank headers are passed over', () => {
    const reading = readHeaders('spans', 'Spans', [...headers.filter((header) => header !== 'span_length_m'), 'span_length_ft', '', ' ']);
    expect(reading.problems).toEqual([]);
  });
});
