import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import type { Reading } from '../types';

export interface PurgeWindow {
  /** ms: key-off, and key-off + the purge's length. */
  from: number;
  to: number;
  /** ms of the interruption, if the purge was interrupted. */
  interruptedAt: number | null;
}

export interface ReadingsChartProps {
  readings: Reading[];
  windows: PurgeWindow[];
  /** The shown range, ms. */
  fromMs: number;
  toMs: number;
  height?: number;
}

// Design tokens (tailwind.config.ts) repeated for the canvas, which cannot read classes.
const INK = { axis: '#9eabb8', grid: '#2b3643', supply: '#8fc7ff', ambient: '#f2b84b', purge: 'rgba(242, 184, 75, 0.16)', cut: '#ff7a70' };

/** Shades each purge window and draws a dashed line with an "×" where a purge was interrupted. */
function purgeWindowsPlugin(windows: () => PurgeWindow[]): uPlot.Plugin {
  return {
    hooks: {
      drawClear: (u) => {
        const { ctx, bbox } = u;
        ctx.save();
        ctx.fillStyle = INK.purge;
        for (const w of windows()) {
          const x0 = u.valToPos(w.from / 1000, 'x', true);
          const x1 = u.valToPos(w.to / 1000, 'x', true);
          if (x1 < bbox.left || x0 > bbox.left + bbox.width) continue;
          ctx.fillRect(Math.max(x0, bbox.left), bbox.top, Math.max(2, Math.min(x1, bbox.left + bbox.width) - Math.max(x0, bbox.left)), bbox.height);
        }
        ctx.restore();
      },
      draw: (u) => {
        const { ctx, bbox } = u;
        ctx.save();
        ctx.strokeStyle = INK.cut;
        ctx.fillStyle = INK.cut;
        ctx.lineWidth = 2 * devicePixelRatio;
        ctx.setLineDash([6 * devicePixelRatio, 4 * devicePixelRatio]);
        ctx.font = `${14 * devicePixelRatio}px sans-serif`;
        for (const w of windows()) {
          if (w.interruptedAt === null) continue;
          const x = u.valToPos(w.interruptedAt / 1000, 'x', true);
          if (x < bbox.left || x > bbox.left + bbox.width) continue;
          ctx.beginPath();
          ctx.moveTo(x, bbox.top);
          ctx.lineTo(x, bbox.top + bbox.height);
          ctx.stroke();
          // Label on the side with room, so it never runs off the plot.
          const right = x > bbox.left + bbox.width / 2;
          ctx.textAlign = right ? 'right' : 'left';
          ctx.fillText('× interrupted', x + (right ? -6 : 6) * devicePixelRatio, bbox.top + 16 * devicePixelRatio);
        }
        ctx.restore();
      },
    },
  };
}

// Gateway protocol: a powered gateway reports at least every 15 min. A longer silence (supply cut,
// isolated) is drawn as a break in the lines rather than a straight line across it.
const GAP_S = 20 * 60;

function toData(readings: Reading[]): uPlot.AlignedData {
  // uPlot wants ascending seconds on x.
  const sorted = [...readings].sort((a, b) => Date.parse(a.ts) - Date.parse(b.ts));
  const xs: number[] = [];
  const volts: (number | null)[] = [];
  const temps: (number | null)[] = [];
  for (const r of sorted) {
    const x = Date.parse(r.ts) / 1000;
    if (xs.length && x - xs[xs.length - 1] > GAP_S) {
      xs.push(xs[xs.length - 1] + 1);
      volts.push(null);
      temps.push(null);
    }
    xs.push(x);
    volts.push(r.supplyV);
    temps.push(r.ambientC);
  }
  return [xs, volts, temps];
}

/** Supply voltage (left axis) and ambient (right axis) over the chosen range, purge windows shaded. */
export function ReadingsChart({ readings, windows, fromMs, toMs, height = 320 }: ReadingsChartProps) {
  const host = useRef<HTMLDivElement>(null);
  const plot = useRef<uPlot | null>(null);
  const windowsRef = useRef(windows);
  windowsRef.current = windows;

  useEffect(() => {
    const el = host.current;
    if (!el) return;
    // Sparse data (a unit that just started reporting) would vanish as bare lines: mark each reading.
    const points = { show: readings.length < 300, size: 6 };
    const opts: uPlot.Options = {
      width: el.clientWidth || 800,
      height,
      scales: { x: { time: true, range: [fromMs / 1000, toMs / 1000] }, v: { auto: true }, c: { auto: true } },
      axes: [
        { stroke: INK.axis, grid: { stroke: INK.grid }, ticks: { stroke: INK.grid } },
        { scale: 'v', label: 'Supply (V)', stroke: INK.supply, grid: { stroke: INK.grid }, ticks: { stroke: INK.grid } },
        { scale: 'c', label: 'Ambient (°C)', side: 1, stroke: INK.ambient, grid: { show: false } },
      ],
      series: [
        {},
        { label: 'Supply V', scale: 'v', stroke: INK.supply, width: 2, points: { ...points, fill: INK.supply }, value: (_u, v) => (v === null ? '—' : `${v.toFixed(2)} V`) },
        { label: 'Ambient °C', scale: 'c', stroke: INK.ambient, width: 2, dash: [8, 4], points: { ...points, fill: INK.ambient }, value: (_u, v) => (v === null ? '—' : `${v.toFixed(1)} °C`) },
      ],
      plugins: [purgeWindowsPlugin(() => windowsRef.current)],
    };
    const u = new uPlot(opts, toData(readings), el);
    plot.current = u;
    const ro = new ResizeObserver(() => u.setSize({ width: el.clientWidth, height }));
    ro.observe(el);
    return () => {
      ro.disconnect();
      u.destroy();
      plot.current = null;
    };
    // Rebuilt when the range changes; new readings for the same range only swap the data below.
  }, [fromMs, toMs, height]);

  useEffect(() => {
    plot.current?.setData(toData(readings), false);
    plot.current?.redraw();
  }, [readings, windows]);

  return <div ref={host} className="afterwatch-chart w-full" aria-label="Supply voltage and ambient temperature chart" role="img" />;
}
