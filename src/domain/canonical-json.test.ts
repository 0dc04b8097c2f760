import { describe, expect, it } from 'vitest';
import { canonicalJson } from './canonical-json';

describe.each([
  { name: 'sorts keys at every depth', value: { b: 1, a: { d: [2, { z: 1, y: 2 }], c: 'x' } }, text: '{"a":{"c":"x","d":[2,{"y":2,"z":1}]},"b":1}' },
  { name: 'drops undefined members', value: { a: undefined, b: null }, text: '{"b":null}' },
  { name: 'writes undefined array items as null', value: [1, undefined], text: '[1,null]' },
  { name: 'escapes strings as JSON does', value: { 'k"': 'line\nbreak' }, text: '{"k\\"":"line\\nbreak"}' },
])('canonicalJson: $name', ({ value, text }) => {
  it('gives the expected text, which parses back to the same data', () => {
    expect(canonicalJson(value)).toBe(text);
    expect(JSON.parse(text)).toEqual(JSON.parse(JSON.stringify(value)));
  });
});

it('gives equal text for equal content written in a different key order', () => {
  expect(canonicalJson({ x: 1, y: [{ p: 1, q: 2 }] })).toBe(canonicalJson({ y: [{ q: 2, p: 1 }], x: 1 }));
});

it.each([NaN, Infinity, () => 1])('refuses %s', (v) => {
  expect(() => canonicalJson({ v })).toThrow(TypeError);
});
