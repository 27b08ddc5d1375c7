import { useId } from "react";

export type FieldErrors = Partial<Record<string, string[] | undefined>>;

const inputClass =
  "mt-1 block w-full rounded border border-rule bg-white px-3 py-2 text-base shadow-inner outline-none focus:border-steel focus:ring-2 focus:ring-steel/30 aria-[invalid=true]:border-fail";

type FieldProps = {
  label: string;
  name: string;
  errors?: string[];
  hint?: string;
} & Omit<React.InputHTMLAttributes<HTMLInputElement>, "name">;

/** A labelled input with its hint and errors announced to assistive technology. */
export function Field({ label, name, errors, hint, id, ...input }: FieldProps) {
  const autoId = useId();
  const fieldId = id ?? `${name}-${autoId}`;
  const describedBy = [hint ? `${fieldId}-hint` : null, errors?.length ? `${fieldId}-error` : null]
    .filter(Boolean)
    .join(" ");
  return (
    <div>
      <label htmlFor={fieldId} className="block text-sm font-medium">
        {label}
      </label>
      <input
        id={fieldId}
        name={name}
        className={inputClass}
        aria-invalid={errors?.length ? true : undefined}
        aria-describedby={describedBy || undefined}
        {...input}
      />
      {hint && (
        <p id={`${fieldId}-hint`} className="mt-1 text-xs text-ink-soft">
          {hint}
        </p>
      )}
      <FieldError id={`${fieldId}-error`} errors={errors} />
    </div>
  );
}

type TextAreaProps = { label: string; name: string; errors?: string[] } & Omit<
  React.TextareaHTMLAttributes<HTMLTextAreaElement>,
  "name"
>;

export function TextAreaField({ label, name, errors, id, ...rest }: TextAreaProps) {
  const autoId = useId();
  const fieldId = id ?? `${name}-${autoId}`;
  return (
    <div>
      <label htmlFor={fieldId} className="block text-sm font-medium">
        {label}
      </label>
      <textarea
        id={fieldId}
        name={name}
        rows={3}
        className={inputClass}
        aria-invalid={errors?.length ? true : undefined}
        aria-describedby={errors?.length ? `${fieldId}-error` : undefined}
        {...rest}
      />
      <FieldError id={`${fieldId}-error`} errors={errors} />
    </div>
  );
}

type SelectProps = {
  label: string;
  name: string;
  errors?: string[];
  options: Array<{ value: string; label: string }>;
} & Omit<React.SelectHTMLAttributes<HTMLSelectElement>, "name">;

export function SelectField({ label, name, errors, options, id, ...rest }: SelectProps) {
  const autoId = useId();
  const fieldId = id ?? `${name}-${autoId}`;
  return (
    <div>
      <label htmlFor={fieldId} className="block text-sm font-medium">
        {label}
      </label>
      <select
        id={fieldId}
        name={name}
        className={inputClass}
        aria-invalid={errors?.length ? true : undefined}
        aria-describedby={errors?.length ? `${fieldId}-error` : undefined}
        {...rest}
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      <FieldError id={`${fieldId}-error`} errors={errors} />
    </div>
  );
}

export function FieldError({ id, errors }: { id?: string; errors?: string[] }) {
  if (!errors?.length) return null;
  return (
    <p id={id} className="mt-1 text-sm text-fail">
      {errors.join(" ")}
    </p>
  );
}

export function FormError({ message }: { message?: string | null }) {
  if (!message) return null;
  return (
    <p role="alert" className="rounded border border-fail/40 bg-fail-soft px-3 py-2 text-sm text-fail">
      {message}
    </p>
  );
}

type ButtonProps = React.ButtonHTMLAttributes<HTMLButtonElement> & { tone?: "primary" | "secondary" | "danger" };

export function Button({ tone = "primary", className = "", ...rest }: ButtonProps) {
  const tones = {
    primary: "bg-steel text-white hover:bg-steel/90",
    secondary: "border border-rule bg-white text-ink hover:bg-paper",
    danger: "bg-fail text-white hover:bg-fail/90",
  };
  return (
    <button
      className={`inline-flex items-center justify-center rounded px-4 py-2 text-sm font-semibold disabled:opacity-60 ${tones[tone]} ${className}`}
      {...rest}
    />
  );
}

export function PageHeader({ title, children, lead }: { title: string; lead?: string; children?: React.ReactNode }) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-3">
      <div>
        <h1>{title}</h1>
        {lead && <p className="mt-1 max-w-2xl text-ink-soft">{lead}</p>}
      </div>
      {children && <div className="flex flex-wrap gap-2">{children}</div>}
    </div>
  );
}

export function EmptyState({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <div className="rounded border border-dashed border-rule bg-card p-6 text-center">
      <p className="font-semibold">{title}</p>
      <div className="mt-1 text-sm text-ink-soft">{children}</div>
    </div>
  );
}

export function Card({
  title,
  children,
  className = "",
}: {
  title?: string;
  children: React.ReactNode;
  className?: string;
}) {
  return (
    <section className={`rounded border border-rule bg-card p-4 ${className}`}>
      {title && <h2 className="mb-3 text-lg">{title}</h2>}
      {children}
    </section>
  );
}
