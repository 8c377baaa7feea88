/**
 * The measuring tools on the page: their buttons (with their keys), the fields of the tool in use,
 * the one-line instruction of the next click, and the clicks themselves; when a tool has all its
 * clicks, its change is one transaction on the document (tools/tool.ts, tools/registry.ts).
 */
import type { PixelPoint } from '../scene/types.js';
import { byId, fill, h } from './dom.js';
import { draftPoints, pathText, roundPx, wallIds } from './draft.js';
import { TOOLS } from './tools/registry.js';
import type { DeskTool, ToolValues } from './tools/tool.js';
import type { DeskApp } from './deskApp.js';
import { change } from './documentChanges.js';

export function currentTool(app: DeskApp): DeskTool | null {
  return TOOLS.find((t) => t.id === app.state.toolId) ?? null;
}

/** The tool's values: its fields' initial values, what was typed, and a wall of the document where a wall is asked. */
export function toolValues(app: DeskApp, tool: DeskTool): ToolValues {
  const draft = app.state.history.draft;
  const values = { ...Object.fromEntries(tool.fields.map((f) => [f.name, f.initial])), ...(app.state.toolValues[tool.id] ?? {}) };
  for (const f of tool.fields) if (f.kind === 'wall' && !wallIds(draft).includes(values[f.name])) values[f.name] = wallIds(draft)[0] ?? '';
  return values;
}

/** What to do next, in one line: the next click of the tool in use, or how to select and move. */
export function instructionText(app: DeskApp): string {
  const { state } = app;
  const tool = currentTool(app);
  if (!tool) {
    return state.selection
      ? `Point ${draftPoints(state.history.draft).find((p) => pathText(p.path) === pathText(state.selection!))?.label ?? ''} chosen: drag it, nudge it with the arrow keys (Shift: 0.1 px), or press Delete.`
      : 'Select and move: click a point to choose it, drag it to move it; drag elsewhere to move the picture. Pick a tool to measure.';
  }
  const steps = tool.clicks(toolValues(app, tool), state.history.draft);
  const k = state.clicks.length;
  return `${tool.name}, click ${Math.min(k + 1, steps.length)} of ${steps.length}: ${steps[Math.min(k, steps.length - 1)]}${k > 0 ? ' (Backspace: take back the last click; Esc: drop them)' : ''}`;
}

export function showInstruction(app: DeskApp): void {
  byId('instruction').textContent = instructionText(app);
}

function toolFields(app: DeskApp, tool: DeskTool): HTMLElement[] {
  const values = toolValues(app, tool);
  const walls = wallIds(app.state.history.draft);
  return tool.fields.filter((f) => !f.when || f.when(values)).map((f) => {
    const id = `tool-${tool.id}-${f.name}`;
    let input: HTMLInputElement | HTMLSelectElement | HTMLTextAreaElement;
    if (f.kind === 'wall' || f.kind === 'choice') {
      const choices = f.kind === 'wall' ? walls.map((w) => [w, w] as const) : f.choices ?? [];
      input = h('select', { id, 'data-tool-field': f.name }, choices.length ? choices.map(([v, words]) => h('option', { value: v, text: words })) : [h('option', { value: '', text: '(add a wall under Walls first)' })]);
    } else if (f.kind === 'lines') {
      input = h('textarea', { id, 'data-tool-field': f.name, rows: 5, spellcheck: 'false' });
    } else {
      input = h('input', { type: 'text', id, 'data-tool-field': f.name, inputmode: f.kind === 'number' ? 'decimal' : undefined, spellcheck: 'false' });
    }
    input.value = values[f.name] ?? '';
    input.addEventListener('change', () => {
      app.state.toolValues[tool.id] = { ...(app.state.toolValues[tool.id] ?? {}), [f.name]: input.value };
      if (f.kind === 'choice' || f.kind === 'lines') renderToolPanel(app);
      showInstruction(app);
    });
    return h('div', { class: 'field' }, [h('label', { for: id, text: f.label }), input]);
  });
}

/** The tool buttons, the fields of the tool in use and its instruction. */
export function renderToolPanel(app: DeskApp): void {
  const { state } = app;
  const buttons = TOOLS.map((tool) => {
    const b = h('button', { type: 'button', class: `tool${state.toolId === tool.id ? ' active' : ''}`, 'aria-pressed': String(state.toolId === tool.id), 'data-tool': tool.id }, [
      h('span', { class: 'key', text: tool.key.toUpperCase() }),
      h('span', { text: tool.name }),
    ]);
    b.addEventListener('click', () => pickTool(app, tool.id));
    return b;
  });
  const select = h('button', { type: 'button', class: `tool${state.toolId === null ? ' active' : ''}`, 'aria-pressed': String(state.toolId === null), 'data-tool': 'select' }, [
    h('span', { class: 'key', text: 'Esc' }),
    h('span', { text: 'Select and move' }),
  ]);
  select.addEventListener('click', () => pickTool(app, null));
  fill(byId('tool-buttons'), [select, ...buttons]);
  const tool = currentTool(app);
  fill(byId('tool-fields'), tool ? [h('h3', { text: tool.name }), ...toolFields(app, tool)] : []);
  showInstruction(app);
}

/** Use a tool (null: select and move); its clicks start again. */
export function pickTool(app: DeskApp, id: string | null): void {
  app.state.toolId = id;
  app.state.clicks = [];
  if (id !== null) app.state.selection = null;
  renderToolPanel(app);
  app.drawSoon();
}

/** One click of the tool in use, in picture pixels; the last one makes the tool's change. */
export function placeClick(app: DeskApp, p: PixelPoint): void {
  const { state } = app;
  const tool = currentTool(app);
  if (!tool) return;
  const { w, h: ph } = app.pictureSize();
  if (p[0] < 0 || p[1] < 0 || p[0] > w || p[1] > ph) {
    app.notice(`That point (x ${p[0].toFixed(1)}, y ${p[1].toFixed(1)}) is outside the picture (${w} x ${ph} px).`, 'error');
    return;
  }
  state.clicks = [...state.clicks, [roundPx(p[0]), roundPx(p[1])]];
  const values = toolValues(app, tool);
  const steps = tool.clicks(values, state.history.draft);
  if (state.clicks.length >= steps.length) {
    const result = tool.finish(state.history.draft, state.clicks, values);
    state.clicks = [];
    if (typeof result === 'string') app.notice(result, 'error');
    else change(app, result.label, result.change);
  }
  showInstruction(app);
  app.drawSoon();
}
