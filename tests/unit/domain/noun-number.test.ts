import { describe, expect, it } from 'vitest';
import { comesOutOf, isPluralName } from '../../../shared/domain/noun-number';

// English subject–verb agreement: a plural subject takes "come", a singular one "comes".
describe('isPluralName', () => {
  it.each([
    ['Medium-toast French oak cubes', true],
    ['Oak chips', true],
    ['Oak spiral', false],
    ['Vanilla bean', false],
    ['Vanilla beans', true],
    ['Hibiscus', false],
    ['Glass', false],
    ['Cinnamon sticks (2)', true],
    ['Oak', false],
    ['Molasses', false],
    ['Gas', false],
    ['Chips  ', true],
    ['Citrus', false],
    ['Oasis', false],
    ['Glass beads', true],
  ])('%s → plural %s', (name, plural) => {
    expect(isPluralName(name)).toBe(plural);
  });
});

describe('comesOutOf', () => {
  it('agrees with a plural name', () => {
    expect(comesOutOf('Medium-toast French oak cubes', 'Ash melomel')).toBe('Medium-toast French oak cubes come out of Ash melomel');
  });
  it('agrees with a singular name', () => {
    expect(comesOutOf('Oak spiral', 'Ash melomel')).toBe('Oak spiral comes out of Ash melomel');
  });
});

describe('isPluralName without a word', () => {
  it('calls a name with no letters singular', () => {
    expect(isPluralName('12')).toBe(false);
    expect(isPluralName('')).toBe(false);
    expect(comesOutOf('3', 'Ash melomel')).toBe('3 comes out of Ash melomel');
  });
});
