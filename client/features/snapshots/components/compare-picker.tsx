import { useId, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { LIVE_REF } from '../../../../shared/api/compare';
import { Button } from '../../../components/button';
import { controlClass } from '../../../components/form-field';
import { paths } from '../../../config/paths';
import type { Snapshot } from '../api/get-snapshots';

/** Two menus (the room now, or any snapshot) and a button that opens their comparison. */
export function ComparePicker({ roomId, snapshots }: { roomId: string; snapshots: readonly Snapshot[] }) {
  const id = useId();
  const navigate = useNavigate();
  const [a, setA] = useState(snapshots[0]?.id ?? LIVE_REF);
  const [b, setB] = useState<string>(LIVE_REF);
  const options = [{ value: LIVE_REF, label: 'The room now (live)' }, ...snapshots.map((s) => ({ value: s.id, label: `Snapshot “${s.label}”` }))];
  const menu = (which: 'a' | 'b', value: string, set: (v: string) => void, label: string) => (
    <div className="flex min-w-48 flex-1 flex-col gap-1">
      <label htmlFor={`${id}-${which}`} className="text-sm font-semibold">
        {label}
      </label>
      <select id={`${id}-${which}`} className={controlClass(false)} value={value} onChange={(event) => set(event.target.value)}>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </div>
  );
  return (
    <form
      aria-label="Compare two designs"
      className="flex flex-col gap-3 sm:flex-row sm:items-end"
      onSubmit={(event) => {
        event.preventDefault();
        navigate(paths.compare.getHref(roomId, a, b));
      }}
    >
      {menu('a', a, setA, 'Compare')}
      {menu('b', b, setB, 'with')}
      <Button type="submit" variant="secondary" disabled={a === b}>
        Open the comparison
      </Button>
    </form>
  );
}
