import type { ReactNode } from 'react';
import { Logo, LogoMark } from '../ui/logo';

/** Signed-out pages: the mark and a short line about the product, then the form. Two columns from `lg` up. */
export function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <div className="min-h-dvh lg:grid lg:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
      <aside className="on-dark relative overflow-hidden bg-ink-950 px-5 pt-8 pb-10 text-white lg:flex lg:flex-col lg:justify-between lg:px-12 lg:py-12">
        <Logo tone="dark" size="lg" />
        <div className="relative z-10 mt-6 max-w-md lg:mt-0">
          <p className="text-xl font-semibold leading-snug lg:text-3xl lg:leading-tight">
            Every top-up, leak check and repair of every reefer unit, kept for good.
          </p>
          <p className="mt-3 hidden text-base text-ink-200 lg:block">
            Scan the label on the unit or type its container number, and its whole service history is there.
          </p>
        </div>
        <p className="relative z-10 hidden text-sm text-ink-300 lg:block">
          Service history for refrigerated containers
        </p>
        {/* Decorative: the mark's loop, drawn large and faint behind the text. */}
        <LogoMark className="pointer-events-none absolute -right-16 -bottom-20 size-64 opacity-15 lg:-right-40 lg:-bottom-40 lg:size-[26rem]" />
      </aside>
      <main className="flex justify-center px-4 py-8 lg:items-center lg:px-12">
        <div className="w-full max-w-md">{children}</div>
      </main>
    </div>
  );
}
