import { useLayoutEffect, useRef, useState } from 'react';
import type { DecayFit, DecaySample } from '../../../../../shared/domain';

/** Text of the chart in CSS pixels: the chart is drawn at its own size, so this is what people read. */
const FONT = 13;
const PAD = { left: 44, right: 10, top: 24, bottom: 38 };
/** Width before the box is measured, and the bounds the drawing keeps to. */
const FIRST_WIDTH = 320;
const MIN_WIDTH = 240;
const MAX_WIDTH = 560;

/**
 * The width of an element in CSS pixels, followed as it changes (a phone turned, a side panel
 * opened), so a chart can be drawn at its real size rather than scaled.
 */
function useWidth<T extends HTMLElement>(fallback: number) {
  const ref = useRef<T>(null);
  const [width, setWidth] = useState(fallback);
  useLayoutEffect(() => {
    const element = ref.current;
    if (!element) return;
    const measure = () => setWidth(Math.round(element.getBoundingClientRect().width) || fallback);
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(element);
    return () => observer.disconnect();
  }, [fallback]);
  return [ref, width] as const;
}

/** Round steps for axis ticks: 1, 2 or 5 × 10ⁿ, about `count` of them up to `max`. */
function ticks(max: number, count: number): number[] {
  const raw = max / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? raw;
  const out: number[] = [];
  for (let v = 0; v <= max + step * 1e-9; v += step) out.push(Number(v.toPrecision(6)));
  return out;
}

/**
 * The readings against the fitted decay V0 · e^(−t/τ): used readings filled, readings left out
 * hollow and crossed, the 60 V line dashed. Drawn at the width of its box (text stays 13 px on a
 * 390 px phone as on a desktop); a plain SVG, no chart library. Without a fit (`verdict` null,
 * e.g. the first readings of a capture) it draws the readings alone.
 */
export function DecayPlot({ samples, verdict }: { samples: readonly DecaySample[]; verdict: { fit: DecayFit } | null }) {
  const [box, boxWidth] = useWidth<HTMLElement>(FIRST_WIDTH);
  const width = Math.max(MIN_WIDTH, Math.min(MAX_WIDTH, boxWidth));
  const height = Math.round(Math.max(200, Math.min(280, width * 0.62)));
  const fit = verdict?.fit ?? null;
  const excluded = new Map((fit?.excluded ?? []).map((e) => [e.index, e]));
  const used = samples.map((s, index) => ({ index, t: s.tSeconds, volts: s.volts })).filter((p) => !excluded.has(p.index));
  const left = (fit?.excluded ?? []).map((e) => ({ index: e.index, t: e.tSeconds, volts: e.volts, code: e.code }));
  const tMax = Math.max(...samples.map((s) => s.tSeconds), 1);
  const vMax = Math.max(fit?.v0Volts ?? 0, ...used.map((p) => p.volts), ...left.map((p) => p.volts), 1) * 1.05;
  const x = (t: number) => PAD.left + (t / tMax) * (width - PAD.left - PAD.right);
  const y = (v: number) => height - PAD.bottom - (Math.max(0, Math.min(v, vMax)) / vMax) * (height - PAD.top - PAD.bottom);
  const path = fit
    ? Array.from({ length: 61 }, (_, i) => (tMax * i) / 60)
        .map((t, i) => `${i === 0 ? 'M' : 'L'}${x(t).toFixed(1)},${y(fit.v0Volts * Math.exp(-t / fit.tauSeconds)).toFixed(1)}`)
        .join(' ')
    : null;
  // fewer time ticks on a narrow chart, so the labels never run into each other
  const tTicks = ticks(tMax, width < 360 ? 3 : 5).filter((t) => t <= tMax);
  const vTicks = ticks(vMax, 4).filter((v) => v <= vMax);
  return (
    <figure className="w-full max-w-xl" ref={box}>
      <svg
        width={width}
        height={height}
        viewBox={`0 0 ${width} ${height}`}
        className="block max-w-full"
        role="img"
        aria-label={fit ? `Readings against the fitted decay: ${used.length} used, ${left.length} left out` : `Readings: ${used.length}, no fitted decay yet`}
        data-testid="decay-plot"
      >
        {vTicks.map((v) => (
          <g key={`v${v}`}>
            <line x1={PAD.left} x2={width - PAD.right} y1={y(v)} y2={y(v)} className="stroke-tide-100" strokeWidth={1} />
            <text x={PAD.left - 5} y={y(v) + FONT / 3} textAnchor="end" className="fill-tide-600" fontSize={FONT}>
              {v}
            </text>
          </g>
        ))}
        {tTicks.map((t) => (
          <text key={`t${t}`} x={x(t)} y={height - PAD.bottom + FONT + 3} textAnchor="middle" className="fill-tide-600" fontSize={FONT}>
            {t}
          </text>
        ))}
        <text x={(PAD.left + width - PAD.right) / 2} y={height - 4} textAnchor="middle" className="fill-tide-800" fontSize={FONT}>
          time since isolation (s)
        </text>
        <text x={PAD.left} y={FONT + 2} className="fill-tide-800" fontSize={FONT}>
          DC bus (V)
        </text>
        {60 < vMax ? (
          <g>
            <line x1={PAD.left} x2={width - PAD.right} y1={y(60)} y2={y(60)} className="stroke-eol-600" strokeDasharray="4 3" strokeWidth={1} />
            <text x={width - PAD.right - 2} y={y(60) - 3} textAnchor="end" className="fill-eol-600" fontSize={FONT}>
              60 V
            </text>
          </g>
        ) : null}
        {path ? <path d={path} fill="none" className="stroke-tide-600" strokeWidth={1.5} /> : null}
        {used.map((p) => (
          <circle key={p.index} cx={x(p.t)} cy={y(p.volts)} r={3.5} className="fill-tide-900" />
        ))}
        {left.map((p) => (
          <g key={p.index} className={p.code === 'control-supply-phase' ? 'stroke-watch-600' : 'stroke-eol-600'}>
            <circle cx={x(p.t)} cy={y(p.volts)} r={5} fill="white" strokeWidth={1.5} />
            <line x1={x(p.t) - 3.5} x2={x(p.t) + 3.5} y1={y(p.volts) - 3.5} y2={y(p.volts) + 3.5} strokeWidth={1.5} />
          </g>
        ))}
      </svg>
      <figcaption className="mt-1 flex flex-wrap gap-x-4 gap-y-1 text-sm text-tide-800">
        <span>● reading used</span>
        <span className="text-eol-600">⊗ left out</span>
        {fit ? <span>— fitted decay</span> : null}
        <span className="text-eol-600">- - 60 V</span>
      </figcaption>
    </figure>
  );
}
