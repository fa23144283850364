/**
 * The Patterns screen's state: the decomposition and diagnostics of the history's
 * non-recurring inflows and outflows (computed in the engine worker), and which direction
 * and which series (as booked, or what the patterns leave over) the screen shows.
 */
import type { HistoryPatterns } from '@engine/forecast/decomposeHistory';
import type { ForecastHistory } from '@engine/forecast/history';
import type { RecurringDecision } from '@engine/forecast/recurringComponents';
import { CancelledError, EngineClient, type CallOptions } from '../worker/engineClient';
import type { ParamsOf, ResultOf } from '../worker/protocol';
import { isDataCloneError } from './outlook.svelte';

/** What the state needs from the engine client (injectable for tests and benches). */
export interface PatternsCaller {
  call(method: 'patterns', params: ParamsOf<'patterns'>, options?: CallOptions): Promise<ResultOf<'patterns'>>;
}

export type Direction = 'inflow' | 'outflow';
/** The series whose correlograms are shown: as booked, or the decomposition's remainder. */
export type Subject = 'series' | 'leftovers';
export type PatternsStatus = 'idle' | 'running' | 'done' | 'cancelled' | 'error';

let sharedEngine: EngineClient | null = null;

/** One worker for every Patterns screen (it starts on first use and keeps what it computed). */
function patternsEngine(): EngineClient {
  sharedEngine ??= new EngineClient();
  return sharedEngine;
}

export class PatternsState {
  readonly #engine: PatternsCaller;
  #result = $state.raw<HistoryPatterns | null>(null);
  #status = $state<PatternsStatus>('idle');
  #share = $state(0);
  #label = $state('');
  #error = $state<string | null>(null);
  #direction = $state<Direction>('inflow');
  #subject = $state<Subject>('series');

  #source: ForecastHistory | null = null;
  #decisions: RecurringDecision[] = [];
  #version: number | null = null;
  #controller: AbortController | null = null;
  #run = 0;

  /** @param engine runs the decomposition (default: the Patterns screens' shared worker). */
  constructor(engine: PatternsCaller = patternsEngine()) {
    this.#engine = engine;
  }

  get result(): HistoryPatterns | null {
    return this.#result;
  }
  get status(): PatternsStatus {
    return this.#status;
  }
  get share(): number {
    return this.#share;
  }
  get label(): string {
    return this.#label;
  }
  get error(): string | null {
    return this.#error;
  }
  get direction(): Direction {
    return this.#direction;
  }
  get subject(): Subject {
    return this.#subject;
  }

  setDirection(direction: Direction): void {
    this.#direction = direction;
  }

  setSubject(subject: Subject): void {
    this.#subject = subject;
  }

  /** The screen's inputs; a new version or history decomposes again, stopping an older run. */
  setInputs(history: ForecastHistory | null, decisions: readonly RecurringDecision[], version: number): void {
    if (version === this.#version && history === this.#source) return;
    this.#version = version;
    this.#source = history;
    this.#controller?.abort();
    this.#controller = null;
    if (!history) {
      this.#result = null;
      this.#status = 'idle';
      return;
    }
    this.#decisions = $state.snapshot(decisions) as RecurringDecision[];
    void this.#start(history, this.#decisions);
  }

  cancel(): void {
    this.#controller?.abort();
  }

  /** Computes again (after Cancel or an error). */
  retry(): void {
    if (this.#source && !this.#controller) void this.#start(this.#source, this.#decisions);
  }

  dispose(): void {
    this.#source = null;
    this.#controller?.abort();
  }

  async #start(history: ForecastHistory, decisions: RecurringDecision[]): Promise<void> {
    const run = ++this.#run;
    const controller = new AbortController();
    this.#controller = controller;
    this.#status = 'running';
    this.#error = null;
    this.#share = 0;
    this.#label = 'Starting';
    try {
      const options: CallOptions = {
        signal: controller.signal,
        onProgress: (share, label) => {
          if (run !== this.#run) return;
          this.#share = share;
          this.#label = label;
        },
      };
      let result: HistoryPatterns;
      try {
        result = await this.#engine.call('patterns', { history, decisions }, options);
      } catch (e) {
        if (!isDataCloneError(e)) throw e;
        // A reactive proxy cannot be posted to a worker: post a plain copy instead.
        const plain = $state.snapshot(history) as ForecastHistory;
        result = await this.#engine.call('patterns', { history: plain, decisions }, options);
      }
      if (run !== this.#run) return;
      this.#result = result;
      this.#status = 'done';
    } catch (e) {
      if (run !== this.#run) return;
      if (e instanceof CancelledError) this.#status = 'cancelled';
      else {
        this.#status = 'error';
        this.#error = e instanceof Error ? e.message : String(e);
      }
    } finally {
      if (run === this.#run) this.#controller = null;
    }
  }
}
