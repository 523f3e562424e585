/** The four roles and what each does (../shared/product.md, "People and what they may do"). */
export const ROLES = ['technician', 'supervisor', 'planner', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
	technician: 'Technician',
	supervisor: 'Supervisor',
	planner: 'Planner',
	admin: 'Admin'
};

/** Roles that do floor checks (Floor check, push, recordings). */
export const FIELD_WORK: readonly Role[] = ['technician', 'supervisor', 'admin'];

/** Roles that edit assets, excitation sources and rule sets. */
export const EDITORS: readonly Role[] = ['supervisor', 'admin'];
/** Roles that create, assign and close follow-ups. */
export const PLANNERS: readonly Role[] = ['planner', 'admin'];

/** Roles that see every site; a technician sees only the sites they are assigned to. */
export const FLEET_WIDE: readonly Role[] = ['supervisor', 'planner', 'admin'];

export const canEditAssets = (role: Role) => EDITORS.includes(role);
export const canPlan = (role: Role) => PLANNERS.includes(role);
