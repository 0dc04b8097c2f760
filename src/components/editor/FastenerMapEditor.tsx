/**
 * The fastener map of a sequence: an SVG layout (0–1000 units, y down) with presets, click to
 * add, drag or arrow keys to move, labels, and the order tools. Every fastener always shows its
 * number in the order, so the diagram is readable without colour.
 */
import { useId, useMemo, useRef, useState, type KeyboardEvent, type PointerEvent } from 'react';
import type { Fastener, FastenerMap, OrderMethod } from '../../domain/procedure/schema';
import { circleLayout, gridLayout, perimeterLayout, rowsLayout } from '../../domain/fastener-layouts';
import { generateOrder, validateFasteners } from '../../domain/fastener-order';
import { isDomainError } from '../../domain/errors';

type Tool = 'move' | 'add' | 'number';
type Preset = 'rows' | 'row' | 'circle' | 'grid' | 'perimeter';

const PRESET_LABELS: Record<Preset, string> = {
  rows: 'Two rows of N (N × 2)',
  row: 'Single row of N',
  circle: 'Circle of N',
  grid: 'Grid (columns × rows)',
  perimeter: 'Rectangle edge (long × short)',
};

const METHOD_WORDS: Record<OrderMethod, string> = {
  'centre-out': 'Centre-out',
  'reverse-centre-out': 'Reverse (loosening)',
  cross: 'Cross (circular)',
  manual: 'By hand',
};

const R = 30; // drawn radius, layout units
const HIT = 48; // touch radius: 96 units ≈ 58 px at the usual width
const clamp = (n: number) => Math.max(0, Math.min(1000, Math.round(n)));
const message = (e: unknown) => (isDomainError(e) || e instanceof Error ? e.message : 'That did not work.');

function nextId(fs: readonly Fastener[]): string {
  const used = new Set(fs.map((f) => f.id));
  let n = fs.length + 1;
  while (used.has(`f${n}`)) n++;
  return `f${n}`;
}

function nextLabel(fs: readonly Fastener[]): string {
  const used = new Set(fs.map((f) => f.label.trim().toLowerCase()));
  let n = fs.length + 1;
  while (used.has(String(n))) n++;
  return String(n);
}

export interface FastenerMapEditorProps {
  value: FastenerMap;
  onChange: (map: FastenerMap) => void;
  direction: 'loosen' | 'tighten';
  error?: string | null;
  readOnly?: boolean;
}

export function FastenerMapEditor({ value, onChange, direction, error, readOnly = false }: FastenerMapEditorProps) {
  const uid = useId();
  const svgRef = useRef<SVGSVGElement>(null);
  const [tool, setTool] = useState<Tool>('move');
  const [selected, setSelected] = useState<string | null>(null);
  const [drag, setDrag] = useState<{ id: string; x: number; y: number; moved: boolean } | null>(null);
  const [picked, setPicked] = useState<string[]>([]);
  const [problem, setProblem] = useState<string | null>(null);
  const [preset, setPreset] = useState<Preset>('rows');
  const [countA, setCountA] = useState(5);
  const [countB, setCountB] = useState(2);

  const fasteners = value.fasteners;
  const shown = drag ? fasteners.map((f) => (f.id === drag.id ? { ...f, x: drag.x, y: drag.y } : f)) : fasteners;
  const orderIndex = useMemo(() => new Map(value.order.map((id, i) => [id, i + 1])), [value.order]);
  const pickedIndex = new Map(picked.map((id, i) => [id, i + 1]));
  const sel = fasteners.find((f) => f.id === selected) ?? null;

  const labelProblem = useMemo(() => {
    try {
      validateFasteners(fasteners);
      return null;
    } catch (e) {
      return message(e);
    }
  }, [fasteners]);

  /** New fasteners keep the map's rule: a generated order is generated again; a hand order grows at its end. */
  function withFasteners(fs: Fastener[], method: OrderMethod = value.orderMethod): FastenerMap {
    if (method === 'manual') {
      const ids = new Set(fs.map((f) => f.id));
      const kept = value.order.filter((id) => ids.has(id));
      const added = fs.filter((f) => !kept.includes(f.id)).map((f) => f.id);
      return { fasteners: fs, order: [...kept, ...added], orderMethod: 'manual' };
    }
    try {
      return { fasteners: fs, order: generateOrder(fs, method), orderMethod: method };
    } catch {
      return { fasteners: fs, order: value.order.filter((id) => fs.some((f) => f.id === id)), orderMethod: method };
    }
  }

  function commit(map: FastenerMap) {
    setProblem(null);
    onChange(map);
  }

  function applyMethod(method: Exclude<OrderMethod, 'manual'>) {
    try {
      commit({ ...value, order: generateOrder(fasteners, method), orderMethod: method });
      setTool('move');
      setPicked([]);
    } catch (e) {
      setProblem(message(e));
    }
  }

  function placePreset() {
    try {
      const fs =
        preset === 'rows' ? rowsLayout(countA, 2)
        : preset === 'row' ? rowsLayout(countA, 1)
        : preset === 'circle' ? circleLayout(countA)
        : preset === 'grid' ? gridLayout(countA, countB)
        : perimeterLayout(countA, countB);
      const method: OrderMethod = preset === 'circle' ? 'cross' : direction === 'loosen' ? 'reverse-centre-out' : 'centre-out';
      commit(withFasteners(fs, method));
      setSelected(null);
      setPicked([]);
    } catch (e) {
      setProblem(message(e));
    }
  }

  function toLayout(ev: { clientX: number; clientY: number }): { x: number; y: number } | null {
    const svg = svgRef.current;
    const ctm = svg?.getScreenCTM();
    if (!svg || !ctm) return null;
    const p = new DOMPoint(ev.clientX, ev.clientY).matrixTransform(ctm.inverse());
    return { x: clamp(p.x), y: clamp(p.y) };
  }

  function addAt(pt: { x: number; y: number }) {
    if (fasteners.length >= 200) return setProblem('A map holds at most 200 fasteners.');
    const f: Fastener = { id: nextId(fasteners), label: nextLabel(fasteners), x: pt.x, y: pt.y };
    commit(withFasteners([...fasteners, f]));
    setSelected(f.id);
  }

  function pick(id: string) {
    if (picked.includes(id)) return setProblem(`Fastener ${fasteners.find((f) => f.id === id)?.label ?? id} is already number ${pickedIndex.get(id)}.`);
    const next = [...picked, id];
    setPicked(next);
    setProblem(null);
    if (next.length === fasteners.length) finishNumbering(next);
  }

  function finishNumbering(order = picked) {
    try {
      commit({ ...value, order: generateOrder(fasteners, 'manual', order), orderMethod: 'manual' });
      setPicked([]);
      setTool('move');
    } catch (e) {
      setProblem(message(e));
    }
  }

  function removeSelected() {
    if (!sel) return;
    if (fasteners.length <= 1) return setProblem('A map needs at least one fastener.');
    commit(withFasteners(fasteners.filter((f) => f.id !== sel.id)));
    setSelected(null);
  }

  function moveBy(id: string, dx: number, dy: number) {
    commit(withFasteners(fasteners.map((f) => (f.id === id ? { ...f, x: clamp(f.x + dx), y: clamp(f.y + dy) } : f))));
  }

  const onBackgroundDown = (ev: PointerEvent<SVGRectElement>) => {
    if (readOnly) return;
    if (tool === 'add') {
      const pt = toLayout(ev);
      if (pt) addAt(pt);
    } else if (tool === 'move') setSelected(null);
  };

  const onFastenerDown = (ev: PointerEvent<SVGGElement>, f: Fastener) => {
    if (readOnly) return;
    ev.stopPropagation();
    if (tool === 'number') return pick(f.id);
    setSelected(f.id);
    if (tool === 'move') {
      ev.currentTarget.setPointerCapture(ev.pointerId);
      setDrag({ id: f.id, x: f.x, y: f.y, moved: false });
    }
  };

  const onFastenerMove = (ev: PointerEvent<SVGGElement>) => {
    if (!drag) return;
    const pt = toLayout(ev);
    if (pt) setDrag({ ...drag, ...pt, moved: true });
  };

  const onFastenerUp = () => {
    if (!drag) return;
    const d = drag;
    setDrag(null);
    if (d.moved) commit(withFasteners(fasteners.map((f) => (f.id === d.id ? { ...f, x: d.x, y: d.y } : f))));
  };

  const onFastenerKey = (ev: KeyboardEvent<SVGGElement>, f: Fastener) => {
    if (readOnly) return;
    const step = ev.shiftKey ? 50 : 10;
    const moves: Record<string, [number, number]> = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, -step], ArrowDown: [0, step] };
    const m = moves[ev.key];
    if (m && tool !== 'number') {
      ev.preventDefault();
      setSelected(f.id);
      moveBy(f.id, m[0], m[1]);
    } else if (ev.key === 'Enter' || ev.key === ' ') {
      ev.preventDefault();
      if (tool === 'number') pick(f.id);
      else setSelected(f.id);
    } else if ((ev.key === 'Delete' || ev.key === 'Backspace') && tool !== 'number') {
      ev.preventDefault();
      setSelected(f.id);
      if (fasteners.length > 1) {
        commit(withFasteners(fasteners.filter((x) => x.id !== f.id)));
        setSelected(null);
      } else setProblem('A map needs at least one fastener.');
    }
  };

  const numberingHint =
    tool === 'number'
      ? `Numbering by hand: tap the fasteners in order (${picked.length} of ${fasteners.length} done).`
      : tool === 'add'
        ? 'Adding: tap an empty spot on the layout to place a fastener.'
        : 'Moving: drag a fastener, or focus it and use the arrow keys (Shift for bigger steps).';

  return (
    <div className="space-y-3" data-own-keys="true" data-testid="fastener-map">
      {!readOnly && (
        <fieldset className="tt-card p-3 flex flex-wrap items-end gap-2">
          <legend className="tt-label px-1">Start from a layout</legend>
          <div>
            <label className="tt-label" htmlFor={`${uid}-preset`}>Layout</label>
            <select id={`${uid}-preset`} className="tt-input" value={preset} onChange={(e) => setPreset(e.target.value as Preset)}>
              {(Object.keys(PRESET_LABELS) as Preset[]).map((p) => (
                <option key={p} value={p}>{PRESET_LABELS[p]}</option>
              ))}
            </select>
          </div>
          <div className="w-28">
            <label className="tt-label" htmlFor={`${uid}-a`}>{preset === 'grid' ? 'Columns' : preset === 'perimeter' ? 'Long side' : 'N (per row)'}</label>
            <input id={`${uid}-a`} type="number" min={1} className="tt-input" value={countA} onChange={(e) => setCountA(Number(e.target.value))} />
          </div>
          {(preset === 'grid' || preset === 'perimeter') && (
            <div className="w-28">
              <label className="tt-label" htmlFor={`${uid}-b`}>{preset === 'grid' ? 'Rows' : 'Short side'}</label>
              <input id={`${uid}-b`} type="number" min={0} className="tt-input" value={countB} onChange={(e) => setCountB(Number(e.target.value))} />
            </div>
          )}
          <button type="button" className="tt-btn tt-btn-quiet" onClick={placePreset}>Place layout</button>
          <p className="text-sm text-muted w-full">Placing a layout replaces the fasteners on the map.</p>
        </fieldset>
      )}

      {!readOnly && (
        <div className="flex flex-wrap gap-2 items-center" role="toolbar" aria-label="Fastener map tools">
          <span className="font-semibold">Tool:</span>
          {(['move', 'add'] as const).map((t) => (
            <button key={t} type="button" className={`tt-btn ${tool === t ? 'tt-btn-primary' : 'tt-btn-quiet'}`} aria-pressed={tool === t} onClick={() => { setTool(t); setPicked([]); }}>
              {t === 'move' ? '✥ Select and move' : '+ Add fasteners'}
            </button>
          ))}
          <span className="font-semibold ml-2">Order:</span>
          <button type="button" className="tt-btn tt-btn-quiet" onClick={() => applyMethod('centre-out')}>Centre-out</button>
          <button type="button" className="tt-btn tt-btn-quiet" onClick={() => applyMethod('reverse-centre-out')}>Reverse (loosening)</button>
          <button type="button" className="tt-btn tt-btn-quiet" onClick={() => applyMethod('cross')}>Cross (circular)</button>
          {tool === 'number' ? (
            <>
              <button type="button" className="tt-btn tt-btn-primary" onClick={() => finishNumbering()}>Finish numbering</button>
              <button type="button" className="tt-btn tt-btn-quiet" onClick={() => { setTool('move'); setPicked([]); setProblem(null); }}>Cancel numbering</button>
            </>
          ) : (
            <button type="button" className="tt-btn tt-btn-quiet" onClick={() => { setTool('number'); setPicked([]); setProblem(null); }}>Number by hand</button>
          )}
        </div>
      )}

      <p className="text-sm text-muted" aria-live="polite" data-testid="map-hint">
        {readOnly ? 'Read only.' : numberingHint} Order: <strong data-testid="order-method">{METHOD_WORDS[value.orderMethod]}</strong>, {fasteners.length} fasteners.
      </p>

      <svg
        ref={svgRef}
        viewBox="-60 -60 1120 1120"
        className={`w-full max-w-xl aspect-square bg-sunken rounded-lg border border-line touch-none select-none ${tool === 'add' ? 'cursor-crosshair' : ''}`}
        role="group"
        aria-label={`Fastener layout, ${fasteners.length} fasteners`}
        data-testid="fastener-svg"
      >
        <rect x={-60} y={-60} width={1120} height={1120} fill="transparent" onPointerDown={onBackgroundDown} data-testid="map-canvas" />
        <rect x={0} y={0} width={1000} height={1000} fill="none" stroke="var(--color-line)" strokeDasharray="8 8" pointerEvents="none" />
        {shown.map((f) => {
          const n = orderIndex.get(f.id);
          const p = pickedIndex.get(f.id);
          const isSel = f.id === selected;
          const numberText = tool === 'number' ? (p ? String(p) : '·') : n ? String(n) : '?';
          const state = tool === 'number' ? (p ? `picked as number ${p}` : 'not picked yet') : n ? `order ${n}` : 'not in the order';
          return (
            <g
              key={f.id}
              transform={`translate(${f.x} ${f.y})`}
              tabIndex={readOnly ? -1 : 0}
              role="button"
              aria-pressed={isSel}
              aria-label={`Fastener ${f.label}, ${state}`}
              data-testid={`fastener-${f.id}`}
              data-order={n ?? ''}
              data-label={f.label}
              onPointerDown={(ev) => onFastenerDown(ev, f)}
              onPointerMove={onFastenerMove}
              onPointerUp={onFastenerUp}
              onPointerCancel={() => setDrag(null)}
              onKeyDown={(ev) => onFastenerKey(ev, f)}
              onFocus={() => tool !== 'number' && setSelected(f.id)}
              className="outline-none cursor-pointer"
            >
              <circle r={HIT} fill="transparent" />
              <circle
                r={R}
                fill={isSel ? 'var(--color-accent)' : 'var(--color-surface)'}
                stroke={isSel ? 'var(--color-ink)' : 'var(--color-accent)'}
                strokeWidth={isSel ? 8 : 5}
                strokeDasharray={n || p ? undefined : '6 5'}
              />
              <text
                textAnchor="middle"
                dominantBaseline="central"
                fontSize={30}
                fontWeight={700}
                fill={isSel ? 'var(--color-accent-ink)' : 'var(--color-ink)'}
                data-testid={`order-${f.id}`}
                pointerEvents="none"
              >
                {numberText}
              </text>
              <text y={R + 28} textAnchor="middle" fontSize={24} fill="var(--color-muted)" pointerEvents="none">
                {f.label}
              </text>
            </g>
          );
        })}
      </svg>
      <p className="text-sm text-muted">Big number: place in the order. Small text: the fastener's label. Dashed ring: not in the order yet.</p>

      {sel && !readOnly && (
        <div className="flex flex-wrap items-end gap-2 tt-card p-3" data-testid="fastener-details">
          <div>
            <label className="tt-label" htmlFor={`${uid}-label`}>Label of the selected fastener</label>
            <input
              id={`${uid}-label`}
              className="tt-input"
              value={sel.label}
              maxLength={20}
              onChange={(e) => commit({ ...value, fasteners: fasteners.map((f) => (f.id === sel.id ? { ...f, label: e.target.value } : f)) })}
            />
          </div>
          <span className="text-muted min-h-12 inline-flex items-center">x {Math.round(sel.x)}, y {Math.round(sel.y)}</span>
          <button type="button" className="tt-btn tt-btn-quiet" onClick={removeSelected}>✕ Remove fastener</button>
        </div>
      )}

      {(problem || labelProblem || error) && (
        <p className="tt-field-error" role="alert" data-testid="map-error">
          <span aria-hidden="true">⚠ </span>
          {problem ?? labelProblem ?? error}
        </p>
      )}
    </div>
  );
}
