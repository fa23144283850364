// The --plan path of the CLI and the app give the same numbers for the same seed
// (DESIGN.md section 5: "the scenario format of the app", "same inputs + same seed =
// byte-identical JSON"). A self-consistency check between two front doors of one engine,
// not a check against an outside reference: both must agree value for value, so equality
// is exact, with no tolerance.
//
// (a) The app's path, step by step as the app takes it, with the worker's own method
//     functions (renderer/src/lib/worker/methods.ts) called directly and every call's
//     parameters and result passed through structuredClone, as postMessage does:
//     - import (lib/state/importSession.svelte.ts `add` + `confirm`): `parseStatements`,
//       `buildLedger` over the stored files plus the new ones, then `applyLedgerChange`
//       into a fake-indexeddb WorkspaceDb, with the records `confirm` writes;
//     - history (lib/state/workspace.svelte.ts `historyInput`): the stored files read back
//       with `storedLedgerInput`, then `forecastHistory`; decisions from the `recurring` table;
//     - scenarios (lib/state/scenarios.svelte.ts `addExamples`, `importFile`, summaries and
//       `exportFile`): ScenarioStore records, read through the editor's draft
//       (draftFromDocument + validateDraft);
//     - comparison (components/scenarios/comparisonRun.ts `runComparison`, the screen's
//       runner, seed included) on the worker's `forecast`.
//     The rune classes themselves (ImportSession, WorkspaceState, ScenariosState) need the
//     Svelte compiler, which Vitest here does not load; test/e2e/planParity.spec.ts drives
//     them in the real app.
// (b) The CLI: `runCli(['forecast', …statements, '--plan', FILE, '--seed', …])` in process,
//     and once as `node bin/ebbline.mjs` in a child process.
import 'fake-indexeddb/auto';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../../engine/cli/runCli';
import type { CliIo } from '../../engine/cli/types';
import type { ForecastHistory } from '../../engine/forecast/history';
import { forecastToJson } from '../../engine/forecast/forecastJson';
import type { ForecastConfig, ForecastResult } from '../../engine/forecast/runForecast';
import type { SeriesScope } from '../../engine/ledger/dailySeries';
import type { ImportResult } from '../../engine/import/types';
import { PLAN_SCHEMA, validatePlan } from '../../engine/plan/plan';
import { runwayFromCrossedShares } from '../../engine/runway/runwayFromCrossedShares';
import { DEMO_CUSHION, demoScenarioSet } from '../../engine/scenario/demoScenarios';
import {
  runComparison,
  type ComparisonOutcome,
  type NamedPlan,
  type ScenarioForecastCaller,
} from '../../renderer/src/components/scenarios/comparisonRun';
import { draftFromDocument, validateDraft } from '../../renderer/src/components/scenarios/planDraft';
import {
  nameFromFileName,
  planFileName,
  planFileText,
  readPlanFile,
} from '../../renderer/src/components/scenarios/planFile';
import { ScenarioStore } from '../../renderer/src/components/scenarios/scenarioStore';
import {
  applyLedgerChange,
  newStatementRecord,
  storedLedgerInput,
  type FileToStore,
} from '../../renderer/src/lib/db/applyLedgerChange';
import type { AccountRecord, ScenarioRecord } from '../../renderer/src/lib/db/records';
import { deleteWorkspaceDb, openWorkspaceDb, type WorkspaceDb } from '../../renderer/src/lib/db/WorkspaceDb';
import { clearAnalysisCache } from '../../renderer/src/lib/worker/analysisMethods';
import { engineMethods, type StoredFiles } from '../../renderer/src/lib/worker/methods';

const ROOT = join(import.meta.dirname, '../..');
const DEMO_DIR = join(ROOT, 'resources/demo/statements');
/** The demo's files in the order the app imports them (renderer/demoStatements.ts: sorted names). */
const DEMO_FILES = readdirSync(DEMO_DIR).sort();
const DEMO_PATHS = DEMO_FILES.map((name) => join(DEMO_DIR, name));

/**
 * The Scenarios screen's settings (lib/state/scenarios.svelte.ts, which Vitest cannot load):
 * DEFAULT_CHOICES horizon 91 and paths 5,000; PATH_CHOICES offers 1,000, used for the four
 * demo columns to keep the file short. The seed is the one runComparison reports.
 */
const APP_HORIZON = 91;
const APP_DEFAULT_PATHS = 5000;
const APP_FEWEST_PATHS = 1000;

const context = { progress: () => {} };
const clone = <T>(value: T): T => structuredClone(value);
const nodeIo: CliIo = { readFile: (path) => new Uint8Array(readFileSync(path)) };

/** The worker's `forecast`, behind the engine client's call shape, values cloned as postMessage does. */
const workerCaller: ScenarioForecastCaller = {
  async call(_method, params) {
    return clone(await engineMethods.forecast(clone(params), context));
  },
};

const WORKSPACE_ID = `plan-parity-${process.pid}`;
let db: WorkspaceDb;
let tmp: string;

/** ImportSession.add + confirm for the demo's files on an empty workspace. */
async function importLikeTheApp(): Promise<void> {
  const picked = DEMO_FILES.map((name) => ({ name, bytes: new Uint8Array(readFileSync(join(DEMO_DIR, name))) }));
  const parsed = clone(await engineMethods.parseStatements(clone({ files: picked }), context));
  const extra = parsed.map((f) => ({ file: f.name, result: f.result as ImportResult }));
  // withStoredFiles on an empty workspace: the revision of no files, sent with no files.
  const stored: StoredFiles = { revision: `${WORKSPACE_ID}:`, files: [] };
  const ledger = clone(await engineMethods.buildLedger(clone({ stored, extra }), context));
  const now = '2026-11-01T09:00:00.000Z';
  const add: FileToStore[] = parsed.map((f, i) => {
    const result = f.result as ImportResult;
    return {
      result,
      record: newStatementRecord({
        id: `file-${i + 1}`,
        fileName: f.name,
        format: result.format,
        importedAt: now,
        seq: 1 + i,
        size: f.size,
        contentHash: f.contentHash,
        options: {},
      }),
    };
  });
  await applyLedgerChange(db, { basedOn: [], add, remove: [], ledger, csvMappings: [] });
}

/** WorkspaceState.historyInput: the stored files read back, the history built in the worker. */
async function historyLikeTheApp(scope: SeriesScope) {
  const input = await storedLedgerInput(db);
  const stored: StoredFiles = { revision: `${WORKSPACE_ID}:${input.ids.join(',')}`, files: input.files };
  const history = clone(await engineMethods.forecastHistory(clone({ stored, scope }), context));
  const decisions = (await db.recurring.toArray()).map(({ key, state, edits }) =>
    edits ? { key, state, edits } : { key, state },
  );
  return { history: history as ForecastHistory, decisions };
}

/** A scenario as the comparison takes it and the plan file the editor's "Export plan file" writes. */
function scenarioLikeTheApp(record: ScenarioRecord, currency: string) {
  const validation = validateDraft(draftFromDocument(record.plan, currency, record.name), currency);
  expect(validation.problems, `${record.name} has no problems`).toEqual([]);
  const named: NamedPlan = { id: record.id, name: record.name, plan: validation.plan };
  return { named, fileName: planFileName(record.name), fileText: planFileText(validation.document) };
}

interface CliSettings {
  readonly horizon: number;
  readonly paths: number;
  readonly seed: number;
  /** Decimal amount, as typed after --threshold. */
  readonly threshold: string;
  readonly account?: string;
}

function cliArgs(planFile: string, s: CliSettings): string[] {
  return [
    'forecast',
    ...DEMO_PATHS,
    '--plan',
    planFile,
    '--seed',
    String(s.seed),
    '--horizon',
    String(s.horizon),
    '--paths',
    String(s.paths),
    '--threshold',
    s.threshold,
    ...(s.account ? ['--account', s.account] : []),
    '--format',
    'json',
  ];
}

async function cliForecast(planFile: string, s: CliSettings): Promise<{ stdout: string; doc: unknown }> {
  const outcome = await runCli(cliArgs(planFile, s), nodeIo);
  expect(outcome.stderr).toBe('');
  expect(outcome.exitCode).toBe(0);
  return { stdout: outcome.stdout, doc: JSON.parse(outcome.stdout) };
}

/** The CLI document and the app's result agree value for value, and so do the screen's derived figures. */
function expectSameNumbers(app: ForecastResult, cli: unknown, outcome: ComparisonOutcome, column: number): void {
  const doc = cli as {
    daily: { date: string; pCrossed: number }[];
    shortfall: { probability: number; firstCrossing: unknown };
    threshold: number;
    paths: number;
    asOf: string;
  };
  const appDoc = JSON.parse(JSON.stringify(forecastToJson(app))) as typeof doc;
  // Field by field first, so a failure names what drifted; then the whole document.
  expect(doc.daily).toEqual(appDoc.daily);
  expect(doc.shortfall).toEqual(appDoc.shortfall);
  expect(cli).toEqual(appDoc);
  // What the comparison table shows: the runway read from the same crossed shares, and the
  // figures at the comparison dates.
  const shown = outcome.comparison.columns[column];
  if (!shown) throw new Error(`no column ${column}`);
  const fromCli = runwayFromCrossedShares(
    doc.daily.map((d) => d.pCrossed),
    doc.asOf,
    Math.round(doc.threshold * 100),
    doc.paths,
  );
  expect({ p10: fromCli.p10, p50: fromCli.p50, p90: fromCli.p90 }).toEqual({
    p10: shown.runway.p10,
    p50: shown.runway.p50,
    p90: shown.runway.p90,
  });
  expect(shown.shortfall.probability).toBe(doc.shortfall.probability);
  for (const at of shown.at) {
    const row = doc.daily.find((d) => d.date === at.date) as unknown as Record<string, number>;
    expect([row.p10, row.p50, row.p90, row.pCrossed]).toEqual([
      Math.round(at.p10) / 100,
      Math.round(at.p50) / 100,
      Math.round(at.p90) / 100,
      at.pCrossed,
    ]);
  }
}

beforeAll(async () => {
  clearAnalysisCache();
  tmp = mkdtempSync(join(tmpdir(), 'ebbline-plan-parity-'));
  db = openWorkspaceDb(WORKSPACE_ID);
  await db.open();
  await importLikeTheApp();
});

afterAll(async () => {
  db.close();
  await deleteWorkspaceDb(WORKSPACE_ID);
  rmSync(tmp, { recursive: true, force: true });
});

describe('ebbline forecast --plan and the app give the same numbers', () => {
  it('for the demo’s ready-made scenarios, exported from the app, on the demo comparison’s settings', async () => {
    // ScenariosScreen.addExamples: the business account alone, against the owner's cushion.
    const accounts: AccountRecord[] = await db.accounts.orderBy('order').toArray();
    const business = accounts.find((a) => /business/i.test(`${a.name} (${a.currency})`));
    if (!business) throw new Error('the demo has a business account');
    const { history, decisions } = await historyLikeTheApp({ accountIds: [business.id] });
    expect(decisions).toEqual([]);
    const set = demoScenarioSet(history.asOf);
    const store = new ScenarioStore(db);
    const base = await store.create(set.base.name, set.base, { uniqueName: true });
    const ids: string[] = [];
    for (const s of set.scenarios) ids.push((await store.create(s.name, s.plan, { uniqueName: true })).id);
    const records = await store.list();
    const byId = (id: string) => scenarioLikeTheApp(records.find((r) => r.id === id) as ScenarioRecord, 'EUR');
    const reference = byId(base.id);
    const scenarios = ids.map(byId);

    const outcome = await runComparison(workerCaller, {
      history,
      decisions,
      reference: reference.named,
      scenarios: scenarios.map((s) => s.named),
      settings: { horizon: APP_HORIZON, paths: APP_FEWEST_PATHS, threshold: DEMO_CUSHION * 100 },
    });
    const runs = [outcome.reference, ...outcome.runs];
    const settings: CliSettings = {
      horizon: outcome.settings.horizon,
      paths: outcome.settings.paths,
      seed: outcome.settings.seed,
      threshold: String(DEMO_CUSHION),
      account: business.name,
    };
    const exported = [reference, ...scenarios];
    for (let i = 0; i < exported.length; i++) {
      const file = join(tmp, (exported[i] as (typeof exported)[number]).fileName);
      writeFileSync(file, (exported[i] as (typeof exported)[number]).fileText);
      const cli = await cliForecast(file, settings);
      expectSameNumbers((runs[i] as (typeof runs)[number]).result, cli.doc, outcome, i);
    }

    // Not a vacuous agreement: the plans were applied (four different chances), and the
    // last column crosses the cushion on enough paths to have first-crossing dates.
    const chances = runs.map((r) => r.result.shortfall.probability);
    expect(new Set(chances).size).toBe(4);
    const both = runs[3]?.result.shortfall;
    expect(both?.probability).toBeGreaterThan(0.5);
    expect(both?.probability).toBeLessThan(1);
    expect(both?.firstCrossing.p50).not.toBeNull();
  });

  it('for a client’s plan file (payment delay range, recurring pause and scale, start balance change) on the app’s default settings, also through bin/ebbline.mjs', async () => {
    const clientPlan = {
      schema: PLAN_SCHEMA,
      name: 'Client plan',
      // A loan repaid from the account today.
      startBalanceChange: -26000,
      items: [
        {
          label: 'Glaze workshop invoice 88',
          amount: 1850,
          date: '2026-11-20',
          // Two in three, as a bookkeeper's script writes it (the editor once rounded it).
          probability: 0.6666666667,
          delayDays: { min: 5, max: 40 },
          every: null,
        },
        {
          label: 'Studio assistant',
          amount: -450.5,
          date: '2026-11-25',
          probability: 1,
          delayDays: { min: 0, max: 3 },
          every: 'month',
          until: '2027-01-25',
        },
      ],
      recurring: [
        { match: 'Kilnyard', action: 'pause', from: '2026-12-01', factor: 1 },
        { match: 'office of direct taxes', action: 'scale', from: null, factor: 1.5 },
      ],
    };
    const planFile = join(tmp, 'client-plan.json');
    writeFileSync(planFile, JSON.stringify(clientPlan, null, 2));

    // ScenariosState.importFile, then the scenario as the comparison takes it, on the
    // screen's first scope (all EUR accounts, the CLI's default) and default settings.
    const reading = readPlanFile(new Uint8Array(readFileSync(planFile)), 'client-plan.json');
    if (!reading.ok) throw new Error(reading.message);
    const store = new ScenarioStore(db);
    const record = await store.create(reading.name ?? nameFromFileName('client-plan.json'), reading.document, {
      uniqueName: true,
    });
    const scenario = scenarioLikeTheApp(record, 'EUR');
    // The plan the app forecasts is the plan the CLI reads from the same file.
    const cliPlan = validatePlan(clientPlan, 'EUR');
    expect(cliPlan.ok && cliPlan.plan).toEqual(scenario.named.plan);

    const { history, decisions } = await historyLikeTheApp({ currency: 'EUR' });
    const outcome = await runComparison(workerCaller, {
      history,
      decisions,
      reference: { id: null, name: 'Base forecast (no changes)', plan: null },
      scenarios: [scenario.named],
      settings: { horizon: APP_HORIZON, paths: APP_DEFAULT_PATHS, threshold: 0 },
    });
    const run = outcome.runs[0];
    if (!run) throw new Error('the comparison has the scenario');
    expect(run.unmatched, 'both recurring changes apply').toEqual([]);
    const settings: CliSettings = {
      horizon: outcome.settings.horizon,
      paths: outcome.settings.paths,
      seed: outcome.settings.seed,
      threshold: '0',
    };
    const cli = await cliForecast(planFile, settings);
    expectSameNumbers(run.result, cli.doc, outcome, 1);
    expect(run.result.shortfall.probability).toBeGreaterThan(0);
    expect(run.result.shortfall.probability).toBeLessThan(1);
    expect(run.result.shortfall.probability).not.toBe(outcome.reference.result.shortfall.probability);

    // The command a bookkeeper runs, as a child process: the same bytes.
    const child = spawnSync(process.execPath, [join(ROOT, 'bin/ebbline.mjs'), ...cliArgs(planFile, settings)], {
      cwd: ROOT,
      encoding: 'utf8',
    });
    expect(child.stderr).toBe('');
    expect(child.status).toBe(0);
    expect(child.stdout).toBe(cli.stdout);
  });

  // Settings a ForecastConfig may carry that the CLI has no option for, so a drift there would
  // not show above: the comparison sends exactly these keys and nothing else.
  it('the comparison sends the worker only settings the CLI has options for', async () => {
    const sent: ForecastConfig[] = [];
    const history = { asOf: '2026-10-31' } as ForecastHistory;
    const fake: ScenarioForecastCaller = {
      async call(_m, params) {
        sent.push(params.config);
        throw new Error('stop');
      },
    };
    await expect(
      runComparison(fake, {
        history,
        decisions: [],
        reference: { id: null, name: 'Base', plan: null },
        scenarios: [],
        settings: { horizon: 91, paths: 5000, threshold: 0 },
      }),
    ).rejects.toThrow('stop');
    // decisions: the workspace's recurring decisions, which a plan file does not carry (empty
    // in a fresh workspace such as the demo).
    expect(Object.keys(sent[0] ?? {}).sort()).toEqual(['decisions', 'horizon', 'paths', 'seed', 'threshold']);
  });
});
