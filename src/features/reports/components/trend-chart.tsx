import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';

export interface TrendPoint { week: string; weekStart: string; keyOffs: number; interrupted: number; shareInterrupted: number | null }

// Design tokens (tailwind.config.ts) repeated for the canvas, which cannot read classes.
const INK = { axis: '#9eabb8', grid: '#2b3643', keyOffs: '#8fc7ff', interrupted: '#ff7a70', share: '#f2b84b' };

/** Key-offs and interrupted purges per ISO week (left axis) and the share interrupted (right axis, %). */
export function TrendChart({ points, height = 280, label = 'Weekly trend of key-offs and interrupted purges' }: { points: TrendPoint[]; height?: number; label?: string }) {
  const host = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const el = host.current;
    if (!el) return;
    const xs = points.map((p) => Date.parse(p.weekStart) / 1000);
    const labelOf = new Map(xs.map((x, i) => [x, points[i].week]));
    const bars = uPlot.paths.bars!({ size: [0.35, 40] });
    const opts: uPlot.Options = {
      width: el.clientWidth || 800,
      height,
      scales: { x: { time: false, range: [xs[0] - 4 * 86_400, xs[xs.length - 1] + 4 * 86_400] }, n: { auto: true, range: (_u, _min, max) => [0, Math.max(1, max)] }, p: { range: [0, 100] } },
      axes: [
        { stroke: INK.axis, grid: { stroke: INK.grid }, ticks: { stroke: INK.grid }, splits: () => xs, values: (_u, vals) => vals.map((v) => labelOf.get(v) ?? '') },
        { scale: 'n', label: 'Key-offs', stroke: INK.axis, grid: { stroke: INK.grid } },
        { scale: 'p', label: 'Interrupted (%)', side: 1, stroke: INK.share, grid: { show: false } },
      ],
      series: [
        { label: 'Week', value: (_u, v) => labelOf.get(v) ?? '' },
        { label: 'Key-offs', scale: 'n', stroke: INK.keyOffs, fill: 'rgba(143, 199, 255, 0.35)', paths: bars, points: { show: false } },
        { label: 'Interrupted', scale: 'n', stroke: INK.interrupted, fill: 'rgba(255, 122, 112, 0.7)', paths: bars, points: { show: false } },
        { label: 'Share interrupted', scale: 'p', stroke: INK.share, width: 2, points: { show: true, size: 7, fill: INK.share }, value: (_u, v) => (v === null ? '—' : `${v.toFixed(0)} %`) },
      ],
    };
    const data: uPlot.AlignedData = [xs, points.map((p) => p.keyOffs), points.map((p) => p.interrupted), points.map((p) => (p.shareInterrupted === null ? null : p.shareInterrupted * 100))];
    const u = new uPlot(opts, data, el);
    const ro = new ResizeObserver(() => u.setSize({ width: el.clientWidth, height }));
    ro.observe(el);
    return () => {
      ro.disconnect();
      u.destroy();
    };
  }, [points, height]);
  return <div ref={host} className="afterwatch-chart w-full" role="img" aria-label={label} />;
}
