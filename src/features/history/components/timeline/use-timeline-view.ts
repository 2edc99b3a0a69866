import type { Bounds } from '@visx/brush';
import type { scaleTime } from '@visx/scale';
import { useRef, useState, type PointerEvent as ReactPointerEvent } from 'react';
import {
  brushedView,
  clampView,
  pannedView,
  presetView,
  STRIP_H,
  type PresetId,
  type View,
} from '../../utils/timeline-layout';
import type { BrushHandle } from './overview-strip';

/**
 * The span shown: everything at first, then a span button, the overview strip's brush or dragging the chart. Every
 * move goes through the brush too, so the strip and the chart stay in step.
 */
export function useTimelineView({
  full,
  now,
  innerW,
  stripX,
  onMove,
}: {
  full: View;
  now: number;
  innerW: number;
  stripX: ReturnType<typeof scaleTime<number>>;
  /** Called on every move (the tooltip closes). */
  onMove: () => void;
}) {
  const [preset, setPreset] = useState<PresetId>('all');
  const [chosen, setChosen] = useState<View | null>(null);
  const view = chosen ? clampView(chosen, full) : full;
  const brushRef = useRef<BrushHandle | null>(null);

  const applyView = (v: View, presetId: PresetId) => {
    const next = clampView(v, full);
    setPreset(presetId);
    onMove();
    const brush = brushRef.current;
    if (brush) {
      const x0 = stripX(new Date(next[0]));
      const x1 = stripX(new Date(next[1]));
      brush.updateBrush((prev) => ({
        ...prev,
        start: { x: x0, y: 0 },
        end: { x: x1, y: STRIP_H },
        extent: { x0, x1, y0: 0, y1: STRIP_H },
      }));
    }
    setChosen(next);
  };

  const choosePreset = (id: PresetId) => applyView(presetView(id, now, full), id);

  const onBrush = (b: Bounds | null) => {
    const next = brushedView(b);
    if (next === undefined) return;
    if (next === null) setPreset('all');
    setChosen(next);
  };

  // Drag to pan; a tap without movement is left to the marks.
  const drag = useRef<{ x: number; view: View; moved: boolean } | null>(null);
  const pan = {
    onPointerDown: (e: ReactPointerEvent<SVGRectElement>) => {
      drag.current = { x: e.clientX, view, moved: false };
    },
    onPointerMove: (e: ReactPointerEvent<SVGRectElement>) => {
      const d = drag.current;
      if (!d) return;
      const dx = e.clientX - d.x;
      if (!d.moved && Math.abs(dx) < 6) return;
      if (!d.moved) e.currentTarget.setPointerCapture(e.pointerId);
      d.moved = true;
      applyView(pannedView(d.view, dx, innerW), null);
    },
    onPointerUp: () => {
      const d = drag.current;
      drag.current = null;
      if (d && !d.moved) onMove();
    },
    onPointerCancel: () => {
      drag.current = null;
    },
  };

  return { view, zoomed: chosen !== null, preset, choosePreset, brushRef, onBrush, pan };
}
