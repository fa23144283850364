// The scenarios of a workspace in its Dexie `scenarios` table (fake-indexeddb): create,
// rename, duplicate, save what is typed (valid or not), delete and undo; plan files in
// and out.
import 'fake-indexeddb/auto';
import { afterEach, describe, expect, it } from 'vitest';
import { WorkspaceDb } from '../../renderer/src/lib/db/WorkspaceDb';
import { ScenarioStore, freeScenarioName } from '../../renderer/src/components/scenarios/scenarioStore';
import { draftFromDocument, emptyItem, validateDraft } from '../../renderer/src/components/scenarios/planDraft';
import {
  nameFromFileName,
  planFileName,
  planFileText,
  readPlanFile,
} from '../../renderer/src/components/scenarios/planFile';
import { DEMO_CUSHION, lateCommissionPlan } from '../../engine/scenario/demoScenarios';
import {
  DEFAULT_REPORT_CHOICES,
  REPORT_SETTING,
  saveExampleReportChoices,
} from '../../renderer/src/components/report/reportChoices';

let counter = 0;
const open: WorkspaceDb[] = [];
function freshStore(): { db: WorkspaceDb; store: ScenarioStore } {
  const db = new WorkspaceDb(`scenarios-test-${process.pid}-${++counter}`);
  open.push(db);
  let tick = 0;
  return { db, store: new ScenarioStore(db, () => `2026-11-01T10:00:${String(tick++).padStart(2, '0')}.000Z`) };
}
afterEach(async () => {
  for (const db of open.splice(0)) {
    db.close();
    await db.delete();
  }
});

const encode = (text: string) => new TextEncoder().encode(text);

describe('ScenarioStore', () => {
  it('creates an empty plan document named like the record, and lists by name', async () => {
    const { db, store } = freshStore();
    await store.create('Zebra');
    const a = await store.create('  apple   pie ');
    expect(a.name).toBe('apple pie');
    expect(a.plan).toEqual({
      schema: 'ebbline.plan/1',
      name: 'apple pie',
      items: [],
      recurring: [],
      startBalanceChange: 0,
    });
    expect((await store.list()).map((r) => r.name)).toEqual(['apple pie', 'Zebra']);
    expect(await db.scenarios.count()).toBe(2);
  });

  it('refuses empty and taken names (without case) and leaves the table unchanged', async () => {
    const { db, store } = freshStore();
    const first = await store.create('Late payment');
    await expect(store.create('late PAYMENT')).rejects.toThrow('already exists');
    await expect(store.create('   ')).rejects.toThrow('Give the scenario a name');
    await expect(store.rename(first.id, '')).rejects.toThrow('Give the scenario a name');
    expect(await db.scenarios.toArray()).toEqual([first]);
    expect((await store.create('Late payment', undefined, { uniqueName: true })).name).toBe('Late payment 2');
  });

  it('renames the record and the document’s name together', async () => {
    const { store } = freshStore();
    const r = await store.create('A', lateCommissionPlan());
    const renamed = await store.rename(r.id, 'Commission 45 days late');
    expect(renamed.name).toBe('Commission 45 days late');
    expect((renamed.plan as { name: string }).name).toBe('Commission 45 days late');
    expect((await store.get(r.id))?.updatedAt).toBe(renamed.updatedAt);
    // Renaming to its own name in another case is allowed.
    expect((await store.rename(r.id, 'COMMISSION 45 days late')).name).toBe('COMMISSION 45 days late');
  });

  it('duplicates under a free name with an independent copy of the plan', async () => {
    const { store } = freshStore();
    const r = await store.create('Kiln', lateCommissionPlan());
    const copy = await store.duplicate(r.id);
    const again = await store.duplicate(r.id);
    expect([copy.name, again.name]).toEqual(['Kiln (copy)', 'Kiln (copy) 2']);
    expect(copy.id).not.toBe(r.id);
    expect((copy.plan as { items: unknown[] }).items).toEqual((r.plan as { items: unknown[] }).items);
    await store.savePlan(copy.id, { ...(copy.plan as object), items: [] });
    expect((await store.get(r.id))!.plan).toEqual(r.plan);
  });

  it('saves what is typed, also while it has problems, and reads it back unchanged', async () => {
    const { store } = freshStore();
    const r = await store.create('Typed');
    const draft = {
      ...draftFromDocument(r.plan, 'EUR'),
      items: [{ ...emptyItem('2026-12-01'), label: 'Invoice', amount: '1.250,5x', probability: '90' }],
    };
    const v = validateDraft(draft, 'EUR');
    expect(v.plan).toBeNull();
    await store.savePlan(r.id, v.document);
    const back = draftFromDocument((await store.get(r.id))!.plan, 'EUR');
    expect(back.items[0]).toMatchObject({
      label: 'Invoice',
      amount: '1.250,5x',
      probability: '90',
      date: '2026-12-01',
    });
    const fixed = validateDraft({ ...back, items: [{ ...back.items[0]!, amount: '1.250,50' }] }, 'EUR');
    expect(fixed.plan?.items[0]!.amount).toBe(125050);
  });

  it('deletes and undoes exactly', async () => {
    const { db, store } = freshStore();
    const keep = await store.create('Keep');
    const r = await store.create('Gone', lateCommissionPlan());
    const before = await db.scenarios.get(r.id);
    const removed = await store.remove(r.id);
    expect(removed).toEqual(before);
    expect(await db.scenarios.get(r.id)).toBeUndefined();
    expect(await store.remove(r.id)).toBeUndefined();
    const back = await store.restore(removed!);
    expect(back).toEqual(before);
    expect(await db.scenarios.get(r.id)).toEqual(before);
    expect((await store.list()).map((s) => s.id)).toEqual([r.id, keep.id]);
  });

  it('undo brings a scenario back under a free name when its name was taken meanwhile', async () => {
    const { store } = freshStore();
    const r = await store.create('Hire');
    const removed = (await store.remove(r.id))!;
    await store.create('Hire');
    const back = await store.restore(removed);
    expect(back.id).toBe(r.id);
    expect(back.name).toBe('Hire 2');
    expect((back.plan as { name: string }).name).toBe('Hire 2');
  });

  it('keeps settings (the comparison’s choices)', async () => {
    const { store } = freshStore();
    expect(await store.setting('scenarios.comparison', { horizon: 91 })).toEqual({ horizon: 91 });
    await store.saveSetting('scenarios.comparison', { horizon: 30, selected: ['a'] });
    expect(await store.setting('scenarios.comparison', null)).toEqual({ horizon: 30, selected: ['a'] });
  });
});

describe('saveExampleReportChoices', () => {
  const ids = { referenceId: 'ref', scenarioIds: ['late', 'kiln', 'both'] };

  it('points the report at the combined example on the given accounts, against the cushion', async () => {
    const { store } = freshStore();
    await store.saveSetting(REPORT_SETTING, { ...DEFAULT_REPORT_CHOICES, horizon: 30 });
    await saveExampleReportChoices(store, ids, 'account:biz');
    expect(await store.setting(REPORT_SETTING, null)).toEqual({
      ...DEFAULT_REPORT_CHOICES,
      horizon: 30,
      scenarioId: 'both',
      referenceId: 'ref',
      scopeKey: 'account:biz',
      threshold: DEMO_CUSHION * 100,
      thresholdCurrency: 'EUR',
    });
  });

  it('leaves a scenario the user chose for the report, and the scope when none is known', async () => {
    const { store } = freshStore();
    const chosen = { ...DEFAULT_REPORT_CHOICES, scenarioId: 'mine', scopeKey: 'currency:EUR' };
    await store.saveSetting(REPORT_SETTING, chosen);
    await saveExampleReportChoices(store, ids, 'account:biz');
    expect(await store.setting(REPORT_SETTING, null)).toEqual(chosen);

    const { store: fresh } = freshStore();
    const saved = await saveExampleReportChoices(fresh, ids, null);
    expect(saved.scopeKey).toBeNull();
    expect(saved.scenarioId).toBe('both');
    expect(await fresh.setting(REPORT_SETTING, null)).toEqual(saved);
  });
});

describe('freeScenarioName', () => {
  it('counts up from 2', () => {
    expect(freeScenarioName('Hire', [])).toBe('Hire');
    expect(freeScenarioName('Hire', ['hire', 'Hire 2'])).toBe('Hire 3');
    expect(freeScenarioName('  ', [])).toBe('Scenario');
  });
});

describe('plan files', () => {
  it('reads a CLI plan file (with a BOM) and writes it back as the same document', () => {
    const doc = lateCommissionPlan();
    const reading = readPlanFile(encode(`\uFEFF${planFileText(doc)}`), 'late.json');
    expect(reading).toEqual({ ok: true, document: JSON.parse(JSON.stringify(doc)), name: 'Late commission payment' });
    expect(planFileText(doc).endsWith('}\n')).toBe(true);
  });

  it('refuses what is not a plan document, with a reason', () => {
    const message = (text: string) => {
      const r = readPlanFile(encode(text), 'f.json');
      return r.ok ? null : r.message;
    };
    expect(message('{"schema": "ebbline.plan/1",')).toMatch(/not valid JSON/);
    expect(message('[1, 2]')).toMatch(/no JSON object/);
    expect(message('{"schema": "ebbline.backup/1"}')).toMatch(/not a plan file/);
    expect(message('{"schema": "ebbline.plan/2"}')).toMatch(/newer kind/);
    expect(readPlanFile(new Uint8Array([0xff, 0xfe, 0x00]), 'bin').ok).toBe(false);
  });

  it('accepts a plan document with field problems, so the editor can show them', () => {
    const r = readPlanFile(encode('{"schema": "ebbline.plan/1", "items": [{"label": "x", "amount": "lots"}]}'));
    expect(r.ok).toBe(true);
  });

  it('names files safely', () => {
    expect(planFileName('Kiln: on credit?')).toBe('Kiln- on credit-.plan.json');
    expect(planFileName('   ')).toBe('scenario.plan.json');
    expect(nameFromFileName('C:\\plans\\hire.plan.json')).toBe('hire');
  });
});
