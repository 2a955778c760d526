import type { IndicatorView } from '../../../../shared/realtime/envelope';
import { formatCountdown } from '../../../lib/format';
import { useNow } from '../../../lib/use-now';

// The page beside the isolator, read at arm's length in a dark yard: one word, one large shape,
// white or near-white on black, each state with its own shape so colour is never needed.
type Look = { word: string; line: string; tone: string; shape: 'hourglass' | 'triangle' | 'check' | 'dash' | 'ring' };

function lookOf(ind: IndicatorView): Look {
  if (ind.state === 'hold' && ind.rerunNeeded)
    return { word: 'HOLD', line: 'Purge was interrupted: restore power, key on, key off and wait.', tone: 'text-[#ff8f86]', shape: 'triangle' };
  if (ind.state === 'hold') return { word: 'HOLD', line: 'Purge in progress. Keep battery power on.', tone: 'text-[#ffd27a]', shape: 'hourglass' };
  if (ind.state === 'clear') return { word: 'CLEAR', line: 'Safe to isolate.', tone: 'text-[#6ff0a8]', shape: 'check' };
  if (ind.state === 'dark') return { word: 'KEY ON', line: 'Ignition is on. Nothing to wait for yet.', tone: 'text-white', shape: 'dash' };
  return { word: 'UNKNOWN', line: 'No recent contact — wait and check the light.', tone: 'text-[#d9c2ff]', shape: 'ring' };
}

function Shape({ shape }: { shape: Look['shape'] }) {
  const common = { fill: 'none', stroke: 'currentColor', strokeWidth: 7, strokeLinecap: 'round' as const, strokeLinejoin: 'round' as const };
  return (
    <svg viewBox="0 0 100 100" aria-hidden="true" className="h-40 w-40 sm:h-52 sm:w-52">
      {shape === 'hourglass' && <path d="M25 10h50M25 90h50M30 10c0 22 20 28 20 40s-20 18-20 40M70 10c0 22-20 28-20 40s20 18 20 40" {...common} />}
      {shape === 'triangle' && (
        <g>
          <path d="M50 8 95 90H5z" fill="currentColor" />
          <path d="M50 36v26M50 76v1" stroke="#000" strokeWidth="9" strokeLinecap="round" />
        </g>
      )}
      {shape === 'check' && (
        <g {...common}>
          <circle cx="50" cy="50" r="42" />
          <path d="m30 52 14 14 27-29" strokeWidth="9" />
        </g>
      )}
      {shape === 'dash' && <path d="M20 50h60" {...common} strokeWidth="10" />}
      {shape === 'ring' && <circle cx="50" cy="50" r="40" {...common} strokeDasharray="16 12" />}
    </svg>
  );
}

function Countdown({ remainingS, receivedAt }: { remainingS: number; receivedAt: number }) {
  const now = useNow();
  const left = Math.max(0, Math.ceil(remainingS - Math.max(0, now - receivedAt) / 1000));
  return (
    <p className="font-mono text-7xl font-bold tabular-nums text-white sm:text-8xl" aria-label={`${left} seconds left`}>
      {formatCountdown(left)}
    </p>
  );
}

/** The unit's hold / clear, huge; while purging, the seconds left counted down from the value received. */
export function SwitchIndicator({ indicator, receivedAt }: { indicator: IndicatorView; receivedAt: number }) {
  const look = lookOf(indicator);
  return (
    <div data-indicator={indicator.state} data-rerun={indicator.rerunNeeded} className={`flex flex-col items-center gap-4 text-center ${look.tone}`}>
      <Shape shape={look.shape} />
      <p className="text-7xl font-black tracking-wide sm:text-8xl">{look.word}</p>
      {indicator.state === 'hold' && !indicator.rerunNeeded && indicator.remainingS !== null && (
        <Countdown remainingS={indicator.remainingS} receivedAt={receivedAt} />
      )}
      <p className="max-w-sm text-2xl font-semibold leading-snug text-white">{look.line}</p>
    </div>
  );
}
