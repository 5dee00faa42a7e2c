/**
 * A draggable divider between two panes, also worked from the keyboard (arrow keys move it by
 * 16 px, Shift by 64; Home and End go to the limits), announced as a separator with its position.
 */
import { useRef, type KeyboardEvent, type PointerEvent } from 'react';
import { cx } from '../../../lib/cx';

export interface SplitHandleProps {
  /** "vertical" divides left | right (drag sideways); "horizontal" divides top / bottom */
  orientation: 'vertical' | 'horizontal';
  label: string;
  value: number;
  min: number;
  max: number;
  onChange(value: number): void;
  /** dragging toward the right/bottom makes the value smaller (the pane after the handle) */
  inverted?: boolean;
}

export function SplitHandle({ orientation, label, value, min, max, onChange, inverted }: SplitHandleProps) {
  const start = useRef<{ pos: number; value: number } | null>(null);
  const clamp = (v: number) => Math.max(min, Math.min(max, Math.round(v)));
  const sign = inverted ? -1 : 1;
  const axis = (e: { clientX: number; clientY: number }) => (orientation === 'vertical' ? e.clientX : e.clientY);

  const onPointerDown = (e: PointerEvent<HTMLDivElement>) => {
    start.current = { pos: axis(e), value };
    e.currentTarget.setPointerCapture(e.pointerId);
    e.preventDefault();
  };
  const onPointerMove = (e: PointerEvent<HTMLDivElement>) => {
    const s = start.current;
    if (s) onChange(clamp(s.value + sign * (axis(e) - s.pos)));
  };
  const onPointerUp = (e: PointerEvent<HTMLDivElement>) => {
    start.current = null;
    if (e.currentTarget.hasPointerCapture(e.pointerId)) e.currentTarget.releasePointerCapture(e.pointerId);
  };
  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    const step = e.shiftKey ? 64 : 16;
    const grow = orientation === 'vertical' ? ['ArrowRight'] : ['ArrowDown'];
    const shrink = orientation === 'vertical' ? ['ArrowLeft'] : ['ArrowUp'];
    if (grow.includes(e.key)) onChange(clamp(value + sign * step));
    else if (shrink.includes(e.key)) onChange(clamp(value - sign * step));
    else if (e.key === 'Home') onChange(min);
    else if (e.key === 'End') onChange(max);
    else return;
    e.preventDefault();
  };

  return (
    <div
      role="separator"
      aria-orientation={orientation}
      aria-label={label}
      aria-valuenow={Math.round(value)}
      aria-valuemin={min}
      aria-valuemax={max}
      tabIndex={0}
      onPointerDown={onPointerDown}
      onPointerMove={onPointerMove}
      onPointerUp={onPointerUp}
      onKeyDown={onKeyDown}
      className={cx(
        'group relative shrink-0 touch-none select-none',
        orientation === 'vertical' ? 'w-2 cursor-col-resize' : 'h-2 cursor-row-resize',
      )}
    >
      <span
        className={cx(
          'absolute rounded-full bg-rule transition-colors group-hover:bg-ink-faint group-focus-visible:bg-amber',
          orientation === 'vertical' ? 'inset-y-2 left-[3px] w-[2px]' : 'inset-x-2 top-[3px] h-[2px]',
        )}
      />
    </div>
  );
}
