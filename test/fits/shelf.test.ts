import { setKeeper } from '../../src/fits/keeper';
import { Shelf } from '../../src/fits/shelf';

class Item {
  disposed = false;
  constructor(readonly id: string) {}
  toJSON(): unknown {
    return { id: this.id };
  }
  dispose(): void {
    this.disposed = true;
  }
}

const restore = (json: string): Item => {
  const o = JSON.parse(json) as { id?: unknown };
  if (typeof o.id !== 'string') throw new Error('not an item');
  return new Item(o.id);
};

afterEach(() => setKeeper(null));

describe('Shelf: maps of one kind by handle, most recently used kept', () => {
  test('past its size the least recently used map is disposed and forgotten', () => {
    const shelf = new Shelf<Item>(restore, 2);
    const a = new Item('a');
    const b = new Item('b');
    shelf.remember('a', a);
    shelf.remember('b', b);
    shelf.recall('a'); // a is now the most recent
    shelf.remember('c', new Item('c'));
    // Source: design choice (least recently used goes first).
    expect(b.disposed).toBe(true);
    expect(shelf.handles()).toEqual(['a', 'c']);
  });

  test('two requests for one handle while its fit runs share that fit', async () => {
    const shelf = new Shelf<Item>(restore);
    let fits = 0;
    const fit = () => (fits++, new Promise<Item>((r) => setTimeout(() => r(new Item('x')), 5)));
    const first = shelf.recallOrFit('h', fit);
    const second = shelf.recallOrFit('h', fit);
    expect(await first).toBe(await second);
    expect(fits).toBe(1);
  });

  test("the keeper's copy is used instead of fitting, and a copy that does not read is fitted again and replaced", () => {
    const saved = new Map<string, string>([
      ['good', '{"id":"kept"}'],
      ['bad', '{"nothing":1}'],
    ]);
    setKeeper({ load: (h) => saved.get(h) ?? null, save: (h, json) => void saved.set(h, json) });
    const shelf = new Shelf<Item>(restore);
    expect((shelf.recallOrFit('good', () => new Item('fitted')) as Item).id).toBe('kept');
    expect((shelf.recallOrFit('bad', () => new Item('fitted')) as Item).id).toBe('fitted');
    expect(saved.get('bad')).toBe('{"id":"fitted"}');
  });

  test("find refuses an unknown handle through the caller's message", () => {
    const shelf = new Shelf<Item>(restore);
    setKeeper({ load: () => null, save: () => undefined });
    expect(() =>
      shelf.find('nope', () => {
        throw new Error('no map nope');
      }),
    ).toThrow('no map nope');
  });
});
