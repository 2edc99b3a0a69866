import { cx } from '../../../components/ui/cx';
import { SCORE_BAND_WORDS } from '../../../config/score-bands';

const TONES = {
  tight: 'border-okay-700 bg-okay-50 text-okay-700',
  watch: 'border-heed-800 bg-heed-50 text-heed-800',
  chronic: 'border-alarm-700 bg-alarm-50 text-alarm-700',
} as const;

/** The repeat-leak score with its band in words (never colour alone). */
export function ScoreBadge({
  score,
  band,
  className,
}: {
  score: number;
  band: keyof typeof TONES;
  className?: string;
}) {
  return (
    <span
      className={cx(
        'inline-flex items-center gap-1.5 rounded-full border px-2.5 py-0.5 text-sm font-semibold whitespace-nowrap',
        TONES[band],
        className,
      )}
    >
      <span className="tabular-nums">{score}</span>
      <span aria-hidden="true">·</span>
      {SCORE_BAND_WORDS[band].label}
    </span>
  );
}

export function Flag({ tone, children }: { tone: 'alarm' | 'heed' | 'okay'; children: string }) {
  const tones = { alarm: 'text-alarm-700', heed: 'text-heed-800', okay: 'text-okay-700' };
  return <span className={cx('text-sm font-semibold', tones[tone])}>{children}</span>;
}
