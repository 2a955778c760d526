import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import type { Park } from '../../../../shared/api/battery';
import { stateOfCharge } from '../../../../shared/battery/state-of-charge';

// Design tokens (tailwind.config.ts) repeated for the canvas, which cannot read classes.
const INK = { axis: '#9eabb8', grid: '#2b3643', rested: '#8fc7ff', resting: '#5d6b79', fit: '#f2b84b', floor: '#ff7a70', volts: '#b9a6ff' };

/**
 * One park on hours since charging stopped: state of charge of each reading (dim inside the rest
 * time, where surface charge reads high), the least-squares voltage line read through the table and
 * carried on to the weekend's end, and the
 * advice's floor; the voltage on the right axis.
 */
export function DrainChart({ park, systemVoltage, weekendHours, minSoc, height = 320 }: { park: Park; systemVoltage: 12 | 24; weekendHours: number; minSoc: number; height?: number }) {
  const host = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const el = host.current;
    if (!el) return;
    const t0 = Date.parse(park.chargeStoppedAt);
    const hours = park.readings.map((r) => (Date.parse(r.ts) - t0) / 3_600_000);
    const xs = [...hours, weekendHours];
    const e = park.estimate;
    const firstRested = hours.find((_, i) => park.readings[i].rested) ?? Infinity;
    const fit = (h: number) => (e && h >= firstRested ? stateOfCharge(e.interceptV + e.voltsPerHour * h, systemVoltage) : null);
    const data: uPlot.AlignedData = [
      xs,
      [...park.readings.map((r) => (r.rested ? r.soc : null)), null],
      [...park.readings.map((r) => (r.rested ? null : r.soc)), null],
      xs.map(fit),
      xs.map(() => minSoc),
      [...park.readings.map((r) => r.volts), null],
    ];
    const opts: uPlot.Options = {
      width: el.clientWidth || 800,
      height,
      scales: { x: { time: false, range: [0, weekendHours] }, s: { range: [0, 100] }, v: { auto: true } },
      axes: [
        { stroke: INK.axis, grid: { stroke: INK.grid }, label: 'Hours since charging stopped (key-off)', values: (_u, v) => v.map((h) => `${h} h`) },
        { scale: 's', label: 'State of charge (%)', stroke: INK.axis, grid: { stroke: INK.grid } },
        { scale: 'v', label: 'Voltage (V)', side: 1, stroke: INK.volts, grid: { show: false } },
      ],
      series: [
        { label: 'Hours', value: (_u, v) => (v === null ? '—' : `${v.toFixed(1)} h`) },
        { label: 'Rested reading', scale: 's', stroke: INK.rested, width: 0, points: { show: true, size: 5, fill: INK.rested }, value: (_u, v) => (v === null ? '—' : `${v.toFixed(0)} %`) },
        { label: 'Inside rest time (ignored)', scale: 's', stroke: INK.resting, width: 0, points: { show: true, size: 5, fill: INK.resting }, value: (_u, v) => (v === null ? '—' : `${v.toFixed(0)} %`) },
        { label: 'Fitted drain', scale: 's', stroke: INK.fit, width: 2, dash: [8, 4], spanGaps: true, points: { show: false }, value: (_u, v) => (v === null ? '—' : `${v.toFixed(0)} %`) },
        { label: `Floor ${minSoc} %`, scale: 's', stroke: INK.floor, width: 1, dash: [3, 3], points: { show: false } },
        { label: 'Voltage', scale: 'v', stroke: INK.volts, width: 1, points: { show: false }, value: (_u, v) => (v === null ? '—' : `${v.toFixed(2)} V`) },
      ],
    };
    const u = new uPlot(opts, data, el);
    const ro = new ResizeObserver(() => u.setSize({ width: el.clientWidth, height }));
    ro.observe(el);
    return () => {
      ro.disconnect();
      u.destroy();
    };
  }, [park, systemVoltage, weekendHours, minSoc, height]);
  return <div ref={host} className="afterwatch-chart w-full" role="img" aria-label="State of charge while parked, with the fitted drain and the weekend projection" />;
}
