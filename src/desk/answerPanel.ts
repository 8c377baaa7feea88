/**
 * The answer on the desk: "Date it" runs the date solver in the worker (progress, cancel),
 * shows the text answer of `heliochron date` and the three charts, lets the user choose a
 * candidate whose predicted shadows are drawn over the picture (as `measure --with-best`
 * draws the best one), re-solves after each change once a first answer is there (debounced),
 * and checks a proposed date, range or season (`heliochron check`).
 */
import { predictMeasurements } from '../cli/measureOverlay.js';
import { formatCalendarDate } from '../calendar/format.js';
import { hhmm } from '../report/formatTimes.js';
import type { Candidate, DateAnswer } from '../solver/types.js';
import { h, fill } from './dom.js';
import type { Draft } from './draft.js';
import type { Derived } from './derive.js';
import type { ChosenPrediction } from './exports.js';
import { cancelAll, runInWorker } from './workerClient.js';

/** Wait after the last change before solving again, ms (common practice for typing and dragging). */
export const RESOLVE_DELAY_MS = 400;

export interface AnswerHost {
  readonly draft: () => Draft;
  readonly derived: () => Derived;
  readonly redraw: () => void;
  readonly notice: (text: string, kind?: 'info' | 'error') => void;
}

const $ = <T extends HTMLElement>(id: string): T => document.getElementById(id) as T;

export function candidateCaption(c: Candidate): string {
  return `${formatCalendarDate(c.civilDate)}, ${hhmm(c.times.localApparentMinutes)} local apparent time`;
}

/** SVG markup of a chart from the library, parsed as SVG and adopted (never inserted as HTML). */
function svgNode(markup: string): Node {
  const doc = new DOMParser().parseFromString(markup, 'image/svg+xml');
  return document.importNode(doc.documentElement, true);
}

export class AnswerPanel {
  private answer: DateAnswer | null = null;
  private chosen = 0;
  private running = false;
  private timer = 0;
  private ticker = 0;

  constructor(private readonly host: AnswerHost) {
    $('date-it').addEventListener('click', () => void this.solve(true));
    $('cancel').addEventListener('click', () => this.cancel());
    $('candidate').addEventListener('change', () => {
      this.chosen = Number(($('candidate') as HTMLSelectElement).value);
      this.host.redraw();
    });
    $('check-it').addEventListener('click', () => void this.check());
  }

  /** The predicted shadows of the chosen candidate, for the overlay. */
  chosenPrediction(derived: Derived): ChosenPrediction | null {
    const c = this.answer?.candidates[this.chosen];
    const scene = derived.scene;
    if (!c || !scene) return null;
    const wallAzimuth = (wallId: string): number =>
      c.nuisances.find((n) => n.name === `wall:${wallId}:azimuth`)?.fittedDeg ?? scene.walls.find((w) => w.id === wallId)!.azimuthDeg;
    try {
      const predictions = predictMeasurements(scene, derived.measurements, { azimuthDeg: c.sun.azimuthDeg, altitudeDeg: c.sun.altitudeDeg }, wallAzimuth);
      return { caption: candidateCaption(c), predictions };
    } catch {
      return null;
    }
  }

  /** After a change: solve again (debounced) when a first answer is there and the switch is on. */
  documentChanged(_draft: Draft): void {
    if (!this.answer || !($('auto-solve') as HTMLInputElement).checked) return;
    window.clearTimeout(this.timer);
    this.timer = window.setTimeout(() => void this.solve(false), RESOLVE_DELAY_MS);
  }

  cancel(): void {
    cancelAll();
    this.finish('Cancelled.');
  }

  private finish(text: string): void {
    this.running = false;
    window.clearInterval(this.ticker);
    ($('cancel') as HTMLButtonElement).disabled = true;
    ($('date-it') as HTMLButtonElement).disabled = false;
    $('progress-bar').hidden = true;
    $('progress').textContent = text;
  }

  async solve(withCharts: boolean): Promise<void> {
    const derived = this.host.derived();
    if (!derived.scene) {
      $('progress').textContent = `Not yet: ${derived.refusal?.message ?? 'the scene is not complete'}`;
      return;
    }
    if (this.running) cancelAll();
    this.running = true;
    ($('cancel') as HTMLButtonElement).disabled = false;
    ($('date-it') as HTMLButtonElement).disabled = true;
    const started = performance.now();
    let stage = 'starting the solver';
    let fraction: number | null = null;
    const bar = $('progress-bar') as HTMLProgressElement;
    bar.hidden = false;
    bar.removeAttribute('value'); // no fraction yet: the bar shows that work goes on
    const show = (): void => {
      const percent = fraction === null ? '' : `: ${Math.floor(fraction * 100)}%`;
      $('progress').textContent = `${stage}${percent} (${((performance.now() - started) / 1000).toFixed(1)} s)`;
      if (fraction !== null) bar.value = fraction;
      else bar.removeAttribute('value');
    };
    window.clearInterval(this.ticker);
    this.ticker = window.setInterval(show, 250);
    show();
    const reply = await runInWorker({ kind: 'date', draft: this.host.draft(), charts: withCharts || this.answer === null }, (s, f) => {
      stage = s;
      fraction = f;
      show();
    });
    if (reply.kind === 'error') {
      if (reply.message !== 'cancelled') this.finish(`Not dated: ${reply.message}`);
      return;
    }
    if (reply.kind !== 'date') return;
    const previousId = this.answer?.candidates[this.chosen]?.id;
    this.answer = reply.answer;
    const keep = reply.answer.candidates.findIndex((c) => c.id === previousId);
    this.chosen = keep >= 0 ? keep : 0;
    $('answer-text').textContent = reply.text;
    $('answer-area').dataset.solveMs = String(reply.solveMs);
    $('answer-area').dataset.roundTripMs = String(performance.now() - started);
    $('answer-area').dataset.solves = String(Number($('answer-area').dataset.solves ?? '0') + 1);
    $('answer-area').dataset.firstCandidate = reply.answer.candidates[0] ? candidateCaption(reply.answer.candidates[0]) : '';
    if (reply.charts) {
      fill($('charts'), [
        h('figure', {}, [svgNode(reply.charts.map), h('figcaption', { text: reply.charts.light === 'moon' ? 'Where the moon\u2019s evidence fits in the best candidate\u2019s year: days across, the hours of the night up.' : 'Where the evidence fits: dates across, hours up.' })]),
        h('figure', {}, [svgNode(reply.charts.sky), h('figcaption', { text: reply.charts.light === 'moon' ? 'The moon in the sky at the candidates (the light of this scene is the moon\u2019s).' : 'The sun in the sky at the candidates.' })]),
        h('figure', {}, [svgNode(reply.charts.residuals), h('figcaption', { text: 'How far each observation lies from the best candidate, in sigmas.' })]),
      ]);
    }
    const select = $('candidate') as HTMLSelectElement;
    fill(select, reply.answer.candidates.map((c, k) => h('option', { value: String(k), text: `${k + 1}. ${candidateCaption(c)}` })));
    select.disabled = reply.answer.candidates.length === 0;
    select.value = String(this.chosen);
    this.finish(`Dated in ${(reply.solveMs / 1000).toFixed(2)} s of solving (${((performance.now() - started) / 1000).toFixed(1)} s in all). ${reply.answer.candidates.length} candidates.`);
    this.host.redraw();
  }

  async check(): Promise<void> {
    const val = (id: string): string | undefined => (($(id) as HTMLInputElement).value.trim() || undefined);
    const on = val('check-on');
    const from = val('check-from');
    const to = val('check-to');
    const season = val('check-season');
    const time = val('check-time');
    const proposal = {
      ...(on ? { on } : {}),
      ...(time ? { time } : {}),
      ...(from || to ? { between: [from ?? '', to ?? ''] } : {}),
      ...(season ? { season } : {}),
    };
    $('check-text').textContent = 'Checking...';
    const reply = await runInWorker({ kind: 'check', draft: this.host.draft(), proposal });
    $('check-text').textContent = reply.kind === 'check' ? reply.text : reply.kind === 'error' ? `Not checked: ${reply.message}` : '';
  }
}
