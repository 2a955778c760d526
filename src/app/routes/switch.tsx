import type { ReactNode } from 'react';
import { useParams } from 'react-router-dom';
import { ApiError } from '../../lib/api-error';
import { useSwitchPage } from '../../features/switch/api/get-switch-page';
import { useSwitchFeed } from '../../features/switch/api/use-switch-feed';
import { SwitchIndicator } from '../../features/switch/components/switch-indicator';

function Screen({ children }: { children: ReactNode }) {
  // Pure black and white: the page is read on a phone in the dark, beside the isolator.
  return (
    <div className="min-h-screen bg-black text-white">
      <main className="mx-auto flex min-h-screen max-w-md flex-col items-center justify-between gap-8 px-5 py-8">{children}</main>
    </div>
  );
}

function Withdrawn() {
  return (
    <Screen>
      <div className="my-auto text-center">
        <p className="text-5xl font-black">This link was withdrawn</p>
        <p className="mt-4 text-xl">Ask the depot for the unit's new code. Until then, do not rely on this page.</p>
      </div>
    </Screen>
  );
}

/** No sign-in: one unit's light for the driver at the switch, opened from the printed QR code. */
export function SwitchPage() {
  const token = useParams().token ?? '';
  const page = useSwitchPage(token);
  const feed = useSwitchFeed(token);

  if (feed === 'withdrawn' || (page.error instanceof ApiError && page.error.status === 404)) return <Withdrawn />;
  if (page.isPending) {
    return (
      <Screen>
        <p className="my-auto text-3xl font-bold">Loading…</p>
      </Screen>
    );
  }
  if (page.isError) {
    return (
      <Screen>
        <p role="alert" className="my-auto text-center text-3xl font-bold">
          Cannot reach the service. Do not isolate on the strength of this page; check the light beside the switch.
        </p>
      </Screen>
    );
  }
  const { unit, indicator } = page.data;
  return (
    <Screen>
      <header className="w-full text-center">
        <p className="font-mono text-4xl font-bold">{unit.id}</p>
        <p className="text-xl">
          {unit.name} · {unit.depot}
        </p>
      </header>
      <SwitchIndicator indicator={indicator} receivedAt={page.data.receivedAt} />
      <footer className="w-full text-center">
        <p className="text-lg font-semibold" role="status">
          {feed === 'live' ? '● Live' : '○ Reconnecting… the light above may be out of date'}
        </p>
        <p className="mt-3 text-base leading-snug">
          Caution: this page repeats what the unit's gateway reports. The vehicle manufacturer's procedure and your site's rules
          come first.
        </p>
      </footer>
    </Screen>
  );
}
