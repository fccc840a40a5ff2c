import { Fingerprint } from '../../src/engine/fingerprint';

describe('Fingerprint', () => {
  test('the same numbers and text give the same 14-digit hex; any change gives another', () => {
    const a = new Fingerprint().text('linear').numbers([1, 2, 3]).hex();
    expect(a).toMatch(/^[0-9a-f]{14}$/);
    expect(new Fingerprint().text('linear').numbers([1, 2, 3]).hex()).toBe(a);
    expect(new Fingerprint().text('linear').numbers([1, 2, 3.0000000000000004]).hex()).not.toBe(a);
    expect(new Fingerprint().text('entropic').numbers([1, 2, 3]).hex()).not.toBe(a);
    expect(new Fingerprint().text('linear').numbers([1, 2]).numbers([3]).hex()).not.toBe(a);
  });

  test('hashes exact bits: 0.1 + 0.2 and 0.3 differ, -0 and 0 differ', () => {
    // Source: IEEE 754 (0.1 + 0.2 = 0.30000000000000004; -0 has its sign bit set)
    expect(new Fingerprint().numbers([0.1 + 0.2]).hex()).not.toBe(new Fingerprint().numbers([0.3]).hex());
    expect(new Fingerprint().numbers([-0]).hex()).not.toBe(new Fingerprint().numbers([0]).hex());
  });

  test('no weights (null) and an empty weight list differ', () => {
    expect(new Fingerprint().numbers(null).hex()).not.toBe(new Fingerprint().numbers([]).hex());
  });
});
