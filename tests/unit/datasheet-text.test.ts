/**
 * The datasheet text check (src/lib/datasheet-text.ts) on short texts written here by hand, each with the
 * verdict worked out by hand from the rule (part number without case/spaces/dashes; another kind named
 * strongly = its words present and none of the part's own kind). Part numbers are invented.
 */
import { describe, expect, it } from 'vitest';
import { checkDatasheetText, datasheetTextProblems, matchForm } from '../../src/lib/datasheet-text.ts';
import type { PartCategory } from '../../src/lib/domain/parts.ts';

describe('matchForm', () => {
  it.each([
    ['CWN30L02-S3', 'cwn30l02s3'],
    ['cwn30l02 s3', 'cwn30l02s3'],
    ['CWN30L02\u2013S3', 'cwn30l02s3'], // en dash
    ['CWN30L02\u2212S3', 'cwn30l02s3'], // minus sign
    ['C W N 3 0\nL02-S3', 'cwn30l02s3'],
    ['ＣＷＮ３０', 'cwn30'], // full-width forms fold under NFKC
  ])('%j → %j', (raw, folded) => expect(matchForm(raw)).toBe(folded));
});

describe('checkDatasheetText', () => {
  const cases: [string, { mpn: string; category: PartCategory }, string, string[]][] = [
    ['the MOSFET sheet of the part', { mpn: 'CWN30L02-S3', category: 'mosfet' }, 'CWN30L02-S3 N-channel MOSFET, 30 V', []],
    ['part number set with spaces and an en dash', { mpn: 'CWN30L02-S3', category: 'mosfet' }, 'cwn 30l02 \u2013 s3 MOSFET', []],
    ['a MOSFET sheet that mentions its body diode', { mpn: 'CWN30L02-S3', category: 'mosfet' }, 'CWN30L02-S3 MOSFET body diode', []],
    [
      'a rectifier sheet on a MOSFET (the issue 14 case)',
      { mpn: 'CWN30L02-S3', category: 'mosfet' },
      'ORS20-40-MA Schottky barrier rectifier 40 V',
      ['part-number-missing', 'other-kind'],
    ],
    [
      'a diode sheet naming the MOSFET part number but no MOSFET words',
      { mpn: 'CWN30L02-S3', category: 'mosfet' },
      'Schottky rectifier for use beside CWN30L02-S3',
      ['other-kind'],
    ],
    ['another MOSFET sheet', { mpn: 'CWN30L02-S3', category: 'mosfet' }, 'MQN20T06-S3 N-channel MOSFET', ['part-number-missing']],
    ['a sheet naming no kind at all', { mpn: 'ORS20-40-MA', category: 'diode' }, 'ORS20-40-MA 40 V 2 A', []],
    [
      'a gate driver sheet that drives MOSFETs',
      { mpn: 'PLR1NL20-S6', category: 'driver' },
      'PLR1NL20-S6 low-side gate driver for MOSFET gates',
      [],
    ],
    ['a MOSFET sheet on a gate driver', { mpn: 'PLR1NL20-S6', category: 'driver' }, 'PLR1NL20-S6 N-channel MOSFET', ['other-kind']],
    ['only spaces and dashes (no letters or digits)', { mpn: 'ORS20-40-MA', category: 'diode' }, ' \n - \u2014 ', ['no-text']],
    ['empty text (a scan)', { mpn: 'ORS20-40-MA', category: 'diode' }, '', ['no-text']],
  ];
  it.each(cases)('%s', (_title, part, text, problems) => {
    expect(datasheetTextProblems(checkDatasheetText(part, text))).toEqual(problems);
  });

  it('names the other kind with the words found, and the own-kind words', () => {
    expect(checkDatasheetText({ mpn: 'CWN30L02-S3', category: 'mosfet' }, 'Schottky barrier rectifier diode')).toEqual({
      hasText: true,
      mpnFound: false,
      ownWords: [],
      otherKind: { category: 'diode', words: ['Schottky', 'rectifier', 'diode'] },
    });
    expect(checkDatasheetText({ mpn: 'CWN30L02-S3', category: 'mosfet' }, 'CWN30L02-S3 N-Channel MOSFET, drain–source 30 V')).toMatchObject(
      {
        mpnFound: true,
        ownWords: ['MOSFET', 'N-channel', 'drain-source'],
        otherKind: null,
      },
    );
  });
});
