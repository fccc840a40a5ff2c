import fc from 'fast-check';
import { assertProperty } from './arbitraries';

describe('assertProperty: a time limit that cuts a property short fails it', () => {
  test('a property stopped by its time limit before its floor of cases is a failure that says how many ran', async () => {
    const slow = fc.asyncProperty(fc.integer(), async () => {
      await new Promise((r) => setTimeout(r, 30));
      return true;
    });
    // Source: design choice (floor: a quarter of the run count)
    await expect(assertProperty(slow, 100, 100)).rejects.toThrow(/ran only \d+ of 100 cases before its time limit of 100 ms \(floor 25\)/);
  });

  test('a counterexample is reported, and a quick true property passes', async () => {
    await expect(
      assertProperty(
        fc.property(fc.integer({ min: 0, max: 10 }), (x) => x < 5),
        200,
        5_000,
      ),
    ).rejects.toThrow(/Counterexample/);
    await expect(
      assertProperty(
        fc.property(fc.integer(), (x) => x === x),
        50,
        5_000,
      ),
    ).resolves.toBeUndefined();
  });
});
