/** The problem beside a field: read out when it appears, and named by the field's aria-describedby. */
export function FieldProblem({ id, message }: { id: string; message?: string | null }) {
  if (!message) return null;
  return (
    <p
      id={id}
      role="alert"
      className="mt-1 rounded border-2 border-fail bg-fail-soft px-3 py-2 text-base font-semibold text-fail"
    >
      {message}
    </p>
  );
}

/**
 * A tick a gloved hand can hit: the whole row (at least 48 px tall) toggles it, the box is 28 px, and a ticked row
 * turns green with a heavier border so it reads in sunlight by more than the tick alone.
 */
export function TickRow({
  name,
  value,
  defaultChecked,
  problem,
  onChange,
  children,
}: {
  name: string;
  value?: string;
  defaultChecked?: boolean;
  problem?: string | null;
  onChange?: (checked: boolean) => void;
  children: React.ReactNode;
}) {
  const problemId = `${name}${value ? `-${value}` : ""}-problem`.replace(/[^A-Za-z0-9_-]/g, "-");
  return (
    <div>
      <label className="flex min-h-12 cursor-pointer items-center gap-4 rounded border-2 border-ink/40 bg-white px-3 py-2 text-base text-ink has-[:checked]:border-pass has-[:checked]:bg-pass-soft">
        <input
          type="checkbox"
          name={name}
          value={value}
          defaultChecked={defaultChecked}
          aria-invalid={problem ? true : undefined}
          aria-describedby={problem ? problemId : undefined}
          className="h-7 w-7 shrink-0 accent-pass"
          onChange={onChange ? (e) => onChange(e.target.checked) : undefined}
        />
        <span>{children}</span>
      </label>
      <FieldProblem id={problemId} message={problem} />
    </div>
  );
}
