// Answers the boot script (vite.config.ts, `labelBoot`) asked for before the app's code had arrived, when the phone
// opened a label's address. Each is handed out once, to the first GET of the same address, and only while the page is
// starting: later on, the same address must be asked again.
const EARLY_FOR_MS = 15_000;

type EarlyWindow = { __tightloopEarly?: Record<string, Promise<Response> | undefined> };

export function takeEarlyResponse(url: string): Promise<Response> | undefined {
  if (typeof window === 'undefined') return undefined;
  const early = (window as EarlyWindow).__tightloopEarly;
  if (!early) return undefined;
  if (performance.now() > EARLY_FOR_MS) {
    delete (window as EarlyWindow).__tightloopEarly;
    return undefined;
  }
  const response = early[url];
  delete early[url];
  return response;
}
