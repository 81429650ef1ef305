import { ImportFileError } from './import-file-error';
import { decodeXmlText, END_OF_PART, END_TAG, NEED_MORE, START_TAG, TEXT, XmlScanner } from './xlsx-xml-scanner';

type Event = string;

/** Scans `xml` fed in chunks of `chunkSize` characters; describes every token, joining text split over chunks. */
function scan(xml: string, chunkSize: number): Event[] {
  const scanner = new XmlScanner('test.xml');
  const events: Event[] = [];
  let text = '';
  const flushText = () => {
    if (text) events.push(`text ${decodeXmlText(text)}`);
    text = '';
  };
  const drain = () => {
    for (let token = scanner.next(); token !== NEED_MORE && token !== END_OF_PART; token = scanner.next()) {
      if (token === TEXT) {
        text += scanner.rawText();
        continue;
      }
      flushText();
      const name = scanner.source.slice(scanner.nameStart, scanner.nameEnd);
      const local = scanner.source.slice(scanner.localNameStart, scanner.nameEnd);
      if (token === END_TAG) {
        events.push(`end ${name} (${local})`);
        continue;
      }
      const attributes: string[] = [];
      while (scanner.nextAttribute()) {
        attributes.push(`${scanner.source.slice(scanner.attributeNameStart, scanner.attributeNameEnd)}=${scanner.attributeValue()}`);
      }
      events.push(`start ${name} (${local})${scanner.selfClosing ? ' self-closing' : ''} [${attributes.join(' ')}]`);
    }
  };
  for (let at = 0; at < xml.length; at += chunkSize) {
    scanner.push(xml.slice(at, at + chunkSize));
    drain();
  }
  scanner.finish();
  drain();
  flushText();
  return events;
}

const CHUNK_SIZES: ReadonlyArray<[string, number]> = [
  ['1-character', 1],
  ['7-character', 7],
  ['whole', Number.MAX_SAFE_INTEGER],
];

describe('XmlScanner', () => {
  const xml =
    '<?xml version="1.0" encoding="UTF-8"?>\n' +
    '<x:row r="2" spans=\'1:3\'><!-- a comment with <c> and > inside -->' +
    '<x:c t="inlineStr" r="A2"><x:is><x:t xml:space="preserve"> a &amp; b </x:t></x:is></x:c>' +
    '<c s="1" note="1 > 0 and \'quoted\'"/><v>&#65;&#x42;&lt;&gt;&quot;&apos;</v><t><![CDATA[<not a tag> & kept]]></t></x:row>';
  const expected = [
    'text \n',
    'start x:row (row) [r=2 spans=1:3]',
    'start x:c (c) [t=inlineStr r=A2]',
    'start x:is (is) []',
    'start x:t (t) [xml:space=preserve]',
    'text  a & b ',
    'end x:t (t)',
    'end x:is (is)',
    'end x:c (c)',
    "start c (c) self-closing [s=1 note=1 > 0 and 'quoted']",
    'start v (v) []',
    'text AB<>"\'',
    'end v (v)',
    'start t (t) []',
    'text <not a tag> & kept',
    'end t (t)',
    'end x:row (row)',
  ];

  it.each(CHUNK_SIZES)('gives the same tokens fed in %s chunks', (_label, chunkSize) => {
    expect(scan(xml, chunkSize)).toEqual(expected);
  });

  it('hands over a text that runs to the end of a chunk at once instead of holding it', () => {
    const scanner = new XmlScanner('test.xml');
    scanner.push('<v>12');
    expect(scanner.next()).toBe(START_TAG);
    expect(scanner.next()).toBe(TEXT);
    expect(scanner.rawText()).toBe('12');
    expect(scanner.next()).toBe(NEED_MORE);
    scanner.push('34</v>');
    expect(scanner.next()).toBe(TEXT);
    expect(scanner.rawText()).toBe('34');
    expect(scanner.next()).toBe(END_TAG);
    scanner.finish();
    expect(scanner.next()).toBe(END_OF_PART);
  });

  it('refuses a part that ends inside a tag', () => {
    expect(() => scan('<row r="1"><c r="A1"', 4)).toThrow(ImportFileError);
    expect(() => scan('<row r="1"><c r="A1"', 4)).toThrow(/test\.xml could not be read \(it ends in the middle of a tag\)/);
  });

  it('refuses a document type declaration, which could define entities', () => {
    expect(() => scan('<!DOCTYPE x [<!ENTITY e "boom">]><x>&e;</x>', 100)).toThrow(/declares a document type/);
  });

  it.each([
    ['an attribute without quotes', '<c r=A1/>'],
    ['an attribute without a value', '<c r/>'],
    ['a tag without a name', '< c/>'],
    ['a tag left open before the next one', '<c r="A1" <v>'],
  ])('refuses %s', (_what, bad) => {
    expect(() => scan(bad, 3)).toThrow(ImportFileError);
  });
});

describe('decodeXmlText', () => {
  it('replaces the five predefined entities and decimal and hexadecimal character references (XML 1.0, 4.1 and 4.6)', () => {
    expect(decodeXmlText('&amp;&lt;&gt;&quot;&apos;&#176;&#xB0;&#x1F309;')).toBe('&<>"\'°°🌉');
  });

  it('normalises line breaks but keeps a carriage return written as a reference (XML 1.0, 2.11)', () => {
    expect(decodeXmlText('a\r\nb\rc&#13;')).toBe('a\nb\nc\r');
  });

  it('does not decode twice: an escaped entity stays an entity', () => {
    expect(decodeXmlText('&amp;lt;')).toBe('&lt;');
  });

  it.each(['&nbsp;', '& b', '&amp', '&#xD800;', '&#0;', '&#12a;'])('gives undefined for %s, which XML does not define', (raw) => {
    expect(decodeXmlText(raw)).toBeUndefined();
  });
});
