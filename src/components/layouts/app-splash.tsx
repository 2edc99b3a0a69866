import { Spinner } from '../ui/spinner';
import { LogoMark } from '../ui/logo';

/** First paint while the session is checked. */
export function AppSplash() {
  return (
    <div className="flex min-h-dvh flex-col items-center justify-center gap-4 text-ink-700" aria-busy="true">
      <LogoMark className="size-14" />
      <p className="flex items-center gap-2 text-base">
        <Spinner />
        Opening Tightloop…
      </p>
    </div>
  );
}
