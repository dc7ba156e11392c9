import assert from 'node:assert/strict';
import fc from 'fast-check';
import { parseYamlMetadata, readFlatMetadata } from '../../extension/core/parse/metadata.js';
import { propertyOptions } from '../support/propertyOptions.js';

// Metadata of `key: text` lines is read without the YAML parser; whatever that reader accepts must
// come out as the YAML 1.2 parser reads it (YAML 1.2.2 specification, §7.3.3 plain scalars and
// §10.3 the core schema): the same data, the same key and value ranges, no problems. The lines
// mix what notebooks hold with what YAML reads otherwise: numbers, booleans, nulls, comments,
// colons, quotes, flow indicators, indentation, tabs, repeated keys.
const key = fc.constantFrom('film', 'rate', 'tg', 'substrate_temperature', 'direction', 'note', 'a', '_x', 'true', 'null', 'on', '__proto__', 'x1', '1x', 'key-name', 'Rate');
const value = fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom('10 K/min', 'cooling', 'D-01', '315 K', '1e-6 Pa', '0.85 Tg', '12 °C ± 0.5 °C', 'silicon wafer', 'a [b]', 'a, b', "it's", 'true story', '1 h 10 min', 'x"y', 'M-1', 'up') },
  { weight: 3, arbitrary: fc.constantFrom('10 K/min', 'cooling', 'D-01', '315 K', '1e-6 Pa', '0.85 Tg', '12 °C ± 0.5 °C', '2×10⁻⁷ Torr', 'silicon wafer', 'a [b]', 'a, b', 'x: y', 'x #c', 'x#c', "it's", '"q"', "'q'", '[1, 2]', '{a: 1}', '- a', '? a', '& a', '* a', '! a', '| a', '> a', '% a', '@ a', '` a', 'true', 'True', 'false', 'null', 'NULL', '~', 'yes', 'no', 'on', 'off', '.inf', '-.inf', '.nan', 'NaN', '42', '-7', '+3', '0x1F', '0o17', '1_000', '3.5', '1e3', '.5', '12:30', '1:10 h', 'ends:', 'a\tb', '') },
  { weight: 1, arbitrary: fc.string({ minLength: 0, maxLength: 12 }) },
);
const line = fc.oneof(
  { weight: 8, arbitrary: fc.tuple(key, fc.constantFrom(' ', ' ', ' ', '  ', '\t', ''), value, fc.constantFrom('', ' ', '  ')).map(([k, sp, v, tail]) => `${k}:${sp}${v}${tail}`) },
  { weight: 1, arbitrary: fc.constantFrom('', '  indented: 1', '# comment', '- item', '---', '...', '  more text', 'windows:', '  glass: [1, 2]') },
);

describe('flat metadata read without the YAML parser', () => {
  it('reads what it accepts exactly as the YAML parser does', () => {
    let accepted = 0;
    fc.assert(
      fc.property(fc.array(line, { minLength: 1, maxLength: 6 }), (lines) => {
        const text = lines.join('\n');
        const flat = readFlatMetadata(text);
        if (!flat) return;
        accepted++;
        const yaml = parseYamlMetadata(text);
        assert.deepEqual(flat.data, yaml.data, text);
        assert.deepEqual([...flat.spans], [...yaml.spans], text);
        assert.deepEqual(flat.problems, yaml.problems, text);
        assert.equal(flat.notAMap, yaml.notAMap);
      }),
      propertyOptions(3000, 20261204),
    );
    assert.ok(accepted > 100, `the fast reader took ${accepted} texts`);
  });

  it('takes the metadata notebooks hold', () => {
    const text = 'film: D-01\nrate: 10 K/min\ndirection: cooling\n\ntemperature_calibration: 0.3 K';
    assert.deepEqual(readFlatMetadata(text), parseYamlMetadata(text));
    assert.ok(readFlatMetadata(text));
  });
});

describe('a key the YAML parser refuses', () => {
  it('is left to the parser, which reports it (an implicit key of more than 1024 characters; YAML 1.2.2 §7.4.2)', () => {
    const text = `name: glass\n${'k'.repeat(1025)}: v`;
    assert.equal(readFlatMetadata(text), null);
    assert.ok(parseYamlMetadata(text).problems.length > 0);
  });
});
