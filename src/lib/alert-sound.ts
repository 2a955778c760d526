import { createStore } from './live-store';

const MUTE_KEY = 'afterwatch.alertSoundMuted';

function readMuted(): boolean {
  try {
    return window.localStorage.getItem(MUTE_KEY) === '1';
  } catch {
    return false;
  }
}

/** Whether the monitor muted the alert sound; remembered in this browser. */
export const alertSoundMuted = createStore<boolean>(readMuted());

export function setAlertSoundMuted(muted: boolean) {
  try {
    window.localStorage.setItem(MUTE_KEY, muted ? '1' : '0');
  } catch {
    // storage full or blocked: the choice holds for this page only
  }
  alertSoundMuted.set(muted);
}

let ctx: AudioContext | null = null;

/**
 * Three short falling tones made with the Web Audio API (nothing is fetched). A browser may keep
 * audio suspended until the person has clicked the page once; then this stays silent and the
 * banner alone carries the alert.
 */
export function playAlertSound() {
  if (alertSoundMuted.get()) return;
  const Ctor = window.AudioContext;
  if (!Ctor) return;
  try {
    ctx ??= new Ctor();
    if (ctx.state === 'suspended') void ctx.resume();
    const t0 = ctx.currentTime + 0.02;
    [880, 740, 880].forEach((hz, i) => {
      const osc = ctx!.createOscillator();
      const gain = ctx!.createGain();
      osc.type = 'triangle';
      osc.frequency.value = hz;
      const start = t0 + i * 0.22;
      // Short attack and decay so the tones do not click.
      gain.gain.setValueAtTime(0.0001, start);
      gain.gain.exponentialRampToValueAtTime(0.25, start + 0.02);
      gain.gain.exponentialRampToValueAtTime(0.0001, start + 0.18);
      osc.connect(gain).connect(ctx!.destination);
      osc.start(start);
      osc.stop(start + 0.2);
    });
  } catch {
    // audio unavailable: the banner still shows
  }
}
