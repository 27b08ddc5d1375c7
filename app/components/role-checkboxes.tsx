import { FieldError } from "~/components/ui/form";
import { ROLE_DUTIES, ROLE_LABELS, ROLES, type Role } from "~/utils/roles";

export function RoleCheckboxes({ selected, errors }: { selected: readonly Role[]; errors?: string[] }) {
  return (
    <fieldset>
      <legend className="text-sm font-medium">Roles</legend>
      <div className="mt-1 space-y-2">
        {ROLES.map((role) => (
          <label key={role} className="flex items-start gap-2 text-sm">
            <input
              type="checkbox"
              name="roles"
              value={role}
              defaultChecked={selected.includes(role)}
              className="mt-1"
            />
            <span>
              <span className="font-semibold">{ROLE_LABELS[role]}</span>
              <span className="block text-ink-soft">{ROLE_DUTIES[role]}</span>
            </span>
          </label>
        ))}
      </div>
      <FieldError errors={errors} />
    </fieldset>
  );
}
