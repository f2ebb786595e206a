/**
 * Keeping work in the browser and opening files: autosave writes soon and once per burst,
 * startup offers unsaved work back and restores it exactly, and a bad file never touches
 * the open project. IndexedDB is fake-indexeddb's, in memory.
 */
import 'fake-indexeddb/auto';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { createStore as createIdbStore, get, keys, set, type UseStore } from 'idb-keyval';
import { createEditorStore, type EditorStore } from '../app/store/store.ts';
import { hasUnsavedWork, imagesKey, readWork, startAutosave, WORK_KEY, type Autosave, type WorkRecord } from '../app/persist/autosave.ts';
import { autosaveOf, restoreOfferStore, startup } from '../app/persist/startup.ts';
import { openFile, openImageFile, openProjectFile, projectFileBytes, projectFileName } from '../app/persist/projectIO.ts';
import type { Project, StrokeDoc } from '../src/doc/model.ts';
import { addStroke, newProject, setHidden, updateStroke } from '../src/doc/rules.ts';
import { encodeGrayPng } from '../src/image/codec.ts';
import { createGray } from '../src/image/gray.ts';

let dbCount = 0;
/** A fresh database per test, with a count of the values put under each key. */
function countingDb(): { db: UseStore; puts: Map<string, number> } {
  const inner = createIdbStore(`inkroute-test-${++dbCount}`, 'work');
  const puts = new Map<string, number>();
  const db: UseStore = (mode, callback) => inner(mode, (store) => callback(new Proxy(store, {
    get(target, prop) {
      if (prop === 'put') {
        return (value: unknown, key: IDBValidKey) => {
          puts.set(String(key), (puts.get(String(key)) ?? 0) + 1);
          return target.put(value, key);
        };
      }
      const v = Reflect.get(target, prop, target);
      return typeof v === 'function' ? v.bind(target) : v;
    },
  })));
  return { db, puts };
}

function pngBytes(w = 6, h = 5, pxPerMm?: number): Uint8Array {
  const img = createGray(w, h, Float32Array.from({ length: w * h }, (_, i) => (i % 7) / 6));
  return encodeGrayPng(img, { pxPerMm });
}

function stroke(id: string, y: number): StrokeDoc {
  return {
    id, surfaceId: 'recto', anchors: [{ x: 1, y }, { x: 5, y, r: 1.5 }],
    samples: [0, 1, 2, 3, 4].map((i) => ({ x: 1 + i, y: y + i * 0.1, r: 1.25 + i / 8, support: i === 2 ? 0.1 : 0.95 })),
    restoredSpans: [{ from: 2, to: 2 }], overrides: [{ from: 1, to: 3, kind: 'restored' }], hidden: false,
    cost: { adherence: 0.5, widthChange: 0.1, curvature: 0.2, length: 0.2, total: 1 },
  };
}

function loadedStore(title = 'Ostracon 4'): EditorStore {
  const store = createEditorStore();
  const p = newProject(title, { band: 'visible', file: 'images/visible.png', mime: 'image/png', width: 6, height: 5, bitDepth: 8 }, 10);
  store.getState().loadProject(p, new Map([['images/visible.png', pngBytes()]]));
  return store;
}

async function until<T>(read: () => Promise<T>, ok: (v: T) => boolean, timeoutMs = 3000): Promise<T> {
  const t0 = Date.now();
  for (;;) {
    const v = await read();
    if (ok(v)) return v;
    if (Date.now() - t0 > timeoutMs) throw new Error('timed out');
    await new Promise((r) => setTimeout(r, 10));
  }
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

const running: Autosave[] = [];
afterEach(async () => {
  await Promise.all(running.splice(0).map((a) => a.stop()));
  restoreOfferStore.setState({ offer: undefined });
});

function autosave(store: EditorStore, db: UseStore, delayMs?: number): Autosave {
  const a = startAutosave(store, { db, delayMs });
  running.push(a);
  return a;
}

describe('autosave', () => {
  it('writes a change to IndexedDB within 1 s', async () => {
    const { db } = countingDb();
    const store = loadedStore();
    autosave(store, db);
    const t0 = Date.now();
    store.getState().change((p) => addStroke(p, stroke('a', 2)));
    const rec = await until(() => readWork(db), (r) => r !== undefined);
    const elapsed = Date.now() - t0;
    expect(elapsed).toBeLessThan(1000);
    expect(JSON.parse(rec!.json)).toEqual(store.getState().project);
    expect(rec!.unsaved).toBe(true);
    expect(rec!.title).toBe('Ostracon 4');
  });

  it('coalesces a burst of changes into one write, holding the last state', async () => {
    const { db, puts } = countingDb();
    const store = loadedStore();
    // A delay long against the burst (~150 ms), so a loaded machine cannot split it.
    const a = autosave(store, db, 1500);
    for (let i = 0; i < 30; i++) store.getState().change((p) => addStroke(p, stroke(`s${i}`, i)));
    // And a few more spread over the same window.
    for (let i = 0; i < 5; i++) {
      await sleep(30);
      store.getState().change((p) => setHidden(p, [`s${i}`], true));
    }
    await until(async () => a.writes(), (n) => n > 0, 6000);
    await sleep(400);
    expect(a.writes()).toBe(1);
    expect(puts.get(WORK_KEY)).toBe(1);
    const rec = await readWork(db);
    expect(JSON.parse(rec!.json)).toEqual(store.getState().project);
  });

  it('a steady stream of changes still writes every delay, not only at its end', async () => {
    const { db } = countingDb();
    const store = loadedStore();
    const a = autosave(store, db, 100);
    store.getState().change((p) => addStroke(p, stroke('a', 1)));
    const t0 = Date.now();
    while (Date.now() - t0 < 900) { // about 9 delays: at least 3 writes even on a loaded machine
      store.getState().change((p) => updateStroke(p, 'a', { hidden: !p.strokes.a.hidden }));
      await sleep(20);
    }
    expect(a.writes()).toBeGreaterThanOrEqual(3);
  });

  it('writes the images once per project, and only the current project\'s', async () => {
    const { db, puts } = countingDb();
    const store = loadedStore();
    const a = autosave(store, db, 20);
    const first = store.getState().project!.id;
    for (let i = 0; i < 4; i++) {
      store.getState().change((p) => addStroke(p, stroke(`s${i}`, i)));
      await a.flush();
    }
    expect(a.writes()).toBe(4);
    expect(puts.get(imagesKey(first))).toBe(1);
    const stored = await get<[string, Uint8Array][]>(imagesKey(first), db);
    expect(stored!.map(([f]) => f)).toEqual(['images/visible.png']);
    expect(Buffer.from(stored![0][1]).equals(Buffer.from(store.getState().images.get('images/visible.png')!))).toBe(true);

    // Another project: its images are written and the old ones go.
    const other = newProject('Other', { band: 'visible', file: 'images/visible.png', mime: 'image/png', width: 6, height: 5, bitDepth: 8 });
    store.getState().loadProject(other, new Map([['images/visible.png', pngBytes(6, 5, 3)]]));
    await a.flush();
    await until(() => keys(db), (k) => !k.includes(imagesKey(first)));
    expect(await keys(db)).toEqual(expect.arrayContaining([WORK_KEY, imagesKey(other.id)]));
  });

  it('records at once that the work was saved; the flag follows project !== savedProject', async () => {
    const { db } = countingDb();
    const store = loadedStore();
    expect(hasUnsavedWork(store.getState())).toBe(false);
    const a = autosave(store, db, 5000);
    store.getState().change((p) => addStroke(p, stroke('a', 1)));
    expect(hasUnsavedWork(store.getState())).toBe(true);
    await a.flush();
    expect((await readWork(db))!.unsaved).toBe(true);
    store.getState().markSaved();
    expect(hasUnsavedWork(store.getState())).toBe(false);
    // No waiting for the 5 s delay: a save is written straight away.
    const rec = await until(() => readWork(db), (r) => r?.unsaved === false, 500);
    expect(rec!.unsaved).toBe(false);
    store.getState().undo();
    expect(hasUnsavedWork(store.getState())).toBe(true);
  });
});

describe('startup', () => {
  /** A store whose unsaved work is in `db`, as a tab that was closed would leave it. */
  async function leaveUnsavedWork(db: UseStore): Promise<EditorStore> {
    const store = loadedStore('Sherd 12');
    const a = startAutosave(store, { db, delayMs: 10 });
    store.getState().change((p) => addStroke(p, stroke('a', 1)));
    store.getState().change((p) => addStroke(p, stroke('b', 3)));
    store.getState().change((p) => setHidden(p, ['b'], true));
    await a.stop();
    return store;
  }

  async function offer() {
    await until(async () => restoreOfferStore.getState().offer, (o) => o !== undefined);
    return restoreOfferStore.getState().offer!;
  }

  it('with no kept work loads the demo and asks nothing', async () => {
    const { db } = countingDb();
    const store = createEditorStore();
    const loadDemo = vi.fn(async () => undefined);
    await startup(loadDemo, { store, db });
    expect(loadDemo).toHaveBeenCalledTimes(1);
    expect(restoreOfferStore.getState().offer).toBeUndefined();
    running.push(autosaveOf(store)!);
  });

  it('with saved work only (nothing unsaved) loads the demo and asks nothing', async () => {
    const { db } = countingDb();
    const old = loadedStore();
    const a = startAutosave(old, { db, delayMs: 10 });
    old.getState().change((p) => addStroke(p, stroke('a', 1)));
    old.getState().markSaved();
    await a.stop();
    expect((await readWork(db))!.unsaved).toBe(false);
    const loadDemo = vi.fn(async () => undefined);
    await startup(loadDemo, { store: createEditorStore(), db, autosave: false });
    expect(loadDemo).toHaveBeenCalledTimes(1);
  });

  it('offers unsaved work and restores it exactly', async () => {
    const { db } = countingDb();
    const before = await leaveUnsavedWork(db);
    const store = createEditorStore();
    const loadDemo = vi.fn(async () => undefined);
    const done = startup(loadDemo, { store, db, autosave: false });
    // The same call twice (React's development mode) is the same startup.
    expect(startup(loadDemo, { store, db })).toBe(done);
    const o = await offer();
    expect(o.title).toBe('Sherd 12');
    expect(Math.abs(o.changedAt - Date.now())).toBeLessThan(5000);
    expect(store.getState().project).toBeUndefined();
    o.restore();
    await done;
    expect(loadDemo).not.toHaveBeenCalled();
    expect(restoreOfferStore.getState().offer).toBeUndefined();
    const restored = store.getState().project as Project;
    expect(restored).toEqual(before.getState().project);
    expect(restored.surfaces[0].strokeOrder).toEqual(['a', 'b']);
    const bytes = store.getState().images.get('images/visible.png')!;
    expect(Buffer.from(bytes).equals(Buffer.from(before.getState().images.get('images/visible.png')!))).toBe(true);
    // Restored work is still in no file, and restoring is no undo step.
    expect(hasUnsavedWork(store.getState())).toBe(true);
    expect(store.temporal.getState().pastStates.length).toBe(0);
  });

  it('Discard clears the kept work and loads the demo', async () => {
    const { db } = countingDb();
    await leaveUnsavedWork(db);
    const store = createEditorStore();
    const loadDemo = vi.fn(async () => undefined);
    const done = startup(loadDemo, { store, db, autosave: false });
    (await offer()).discard();
    await done;
    expect(loadDemo).toHaveBeenCalledTimes(1);
    expect(await readWork(db)).toBeUndefined();
    expect(await keys(db)).toEqual([]);
  });

  it('a damaged record gives a message and falls back to the demo', async () => {
    const { db } = countingDb();
    await leaveUnsavedWork(db);
    const rec = (await readWork(db))!;
    const doc = JSON.parse(rec.json);
    doc.strokes.a.samples[0].x = 'oops';
    await set(WORK_KEY, { ...rec, json: JSON.stringify(doc) } satisfies WorkRecord, db);
    const store = createEditorStore();
    const loadDemo = vi.fn(async () => undefined);
    const done = startup(loadDemo, { store, db, autosave: false });
    (await offer()).restore();
    await done;
    expect(loadDemo).toHaveBeenCalledTimes(1);
    expect(store.getState().message?.kind).toBe('error');
    expect(store.getState().message?.text).toMatch(/could not be restored: project\.json is invalid at strokes\.a\.samples\.0\.x/);
  });

  it('a record from a newer version, or cut-off JSON, is refused with a message', async () => {
    for (const json of ['{"format":"inkroute-project","version":99}', '{"format":"inkr']) {
      const { db } = countingDb();
      await set(WORK_KEY, { projectId: 'p1', title: 'T', changedAt: Date.now(), unsaved: true, json } satisfies WorkRecord, db);
      const store = createEditorStore();
      const loadDemo = vi.fn(async () => undefined);
      const done = startup(loadDemo, { store, db, autosave: false });
      (await offer()).restore();
      await done;
      expect(loadDemo).toHaveBeenCalledTimes(1);
      expect(store.getState().message?.text).toMatch(/newer inkroute|not valid JSON/);
    }
  });

  it('starts the autosave only once the question is settled', async () => {
    const { db, puts } = countingDb();
    await leaveUnsavedWork(db);
    const putsBefore = puts.get(WORK_KEY);
    const store = createEditorStore();
    const done = startup(async () => {
      store.getState().loadProject(loadedStore('Demo').getState().project!, new Map([['images/visible.png', pngBytes()]]));
    }, { store, db, autosave: { delayMs: 10 } });
    const o = await offer();
    await sleep(50);
    // The work on offer is still there while the person decides.
    expect(puts.get(WORK_KEY)).toBe(putsBefore);
    expect((await readWork(db))!.title).toBe('Sherd 12');
    o.discard();
    await done;
    const a = autosaveOf(store)!;
    running.push(a);
    store.getState().change((p) => addStroke(p, stroke('z', 1)));
    const rec = await until(() => readWork(db), (r) => r?.title === 'Demo');
    expect(rec!.unsaved).toBe(true);
  });
});

describe('opening files', () => {
  const file = (bytes: Uint8Array | string, name: string, type = '') => new File([bytes as BlobPart], name, { type });

  it('opens a photo as a new project with its size, bit depth and scale from the file', async () => {
    const store = loadedStore();
    const bytes = pngBytes(9, 4, 20);
    expect(await openImageFile(file(bytes, 'Sherd 7 recto.png', 'image/png'), store)).toBe(true);
    const p = store.getState().project!;
    expect(p.title).toBe('Sherd 7 recto');
    expect(p.surfaces[0].pxPerMm).toBe(20);
    expect(p.surfaces[0].images[0]).toMatchObject({ band: 'visible', mime: 'image/png', width: 9, height: 4, bitDepth: 8, file: 'images/visible.png' });
    expect(store.getState().images.get('images/visible.png')).toEqual(bytes);
    expect(p.strokes).toEqual({});
    expect(store.getState().message?.kind).toBe('info');
  });

  it('a file that is not an image, a truncated PNG, a TIFF: a clear message and the project untouched', async () => {
    const store = loadedStore();
    store.getState().change((p) => addStroke(p, stroke('a', 1)));
    const before = store.getState().project;
    const images = store.getState().images;
    const png = pngBytes(40, 30);
    const tiff = new Uint8Array([0x49, 0x49, 42, 0, 8, 0, 0, 0]);
    const cases: [File, RegExp][] = [
      [file('just some notes', 'notes.txt', 'text/plain'), /Could not open notes\.txt: not an image/],
      [file(png.subarray(0, Math.floor(png.length * 0.6)), 'cut.png', 'image/png'), /Could not open cut\.png: the PNG file is (damaged or )?truncated/],
      [file(tiff, 'scan.tif', 'image/tiff'), /TIFF files are not supported yet/],
      [file(new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 0, 16]), 'broken.jpg', 'image/jpeg'), /the JPEG file is damaged or truncated/],
    ];
    for (const [f, pattern] of cases) {
      expect(await openFile(f, store)).toBe(false);
      expect(store.getState().message).toEqual({ kind: 'error', text: expect.stringMatching(pattern) });
      expect(store.getState().project).toBe(before);
      expect(store.getState().images).toBe(images);
    }
  });

  it('opens a project file exactly, and refuses a damaged one leaving the project untouched', async () => {
    const source = loadedStore('Wall plaster, room 3');
    source.getState().change((p) => addStroke(p, stroke('a', 1)));
    const bytes = projectFileBytes(source);
    expect(projectFileName('Wall plaster, room 3')).toBe('Wall plaster, room 3.inkroute');
    expect(projectFileName('a/b: c?')).toBe('a-b- c-.inkroute');

    const store = loadedStore();
    expect(await openFile(file(bytes, 'Wall plaster, room 3.inkroute'), store)).toBe(true);
    expect(store.getState().project).toEqual(source.getState().project);
    expect(hasUnsavedWork(store.getState())).toBe(false);
    // A renamed project file is still found by its zip signature.
    const other = loadedStore();
    expect(await openFile(file(bytes, 'download.bin'), other)).toBe(true);
    expect(other.getState().project).toEqual(source.getState().project);

    const before = store.getState().project;
    expect(await openProjectFile(file(bytes.subarray(0, bytes.length - 100), 'cut.inkroute'), store)).toBe(false);
    expect(store.getState().message?.text).toMatch(/^Could not open cut\.inkroute: the project file is damaged/);
    expect(await openFile(file('{"format":"inkroute-project"}', 'fake.inkroute'), store)).toBe(false);
    expect(store.getState().project).toBe(before);
  });
});
