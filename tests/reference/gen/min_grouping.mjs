// CLDR minimumGroupingDigits as ICU applies it, through node's Intl (full ICU).
// Python babel 2.19 does not apply it, so this is the reference for grouping
// of short integer parts. Run from the repository root:
//     node tests/reference/gen/min_grouping.mjs
// Writes tests/reference/fixtures/format/min_grouping.json.
import fs from 'node:fs';

const LOCALES = ['en', 'de', 'fr', 'es', 'pl'];
const VALUES = [999, 1234, -1234, 2014, 9999, 12345, 1234567];
const cases = [];
for (const locale of LOCALES) {
  const f = new Intl.NumberFormat(locale, { maximumFractionDigits: 0, useGrouping: 'auto' });
  for (const value of VALUES) cases.push({ locale, value, text: f.format(value).replace('\u2212', '-') });
}
const meta = { generator: 'tests/reference/gen/min_grouping.mjs', node: process.versions.node, icu: process.versions.icu, cldr: process.versions.cldr };
fs.writeFileSync('tests/reference/fixtures/format/min_grouping.json', JSON.stringify({ meta, cases }, null, 0) + '\n');
