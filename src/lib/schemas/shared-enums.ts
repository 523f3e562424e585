/** Enumerations both sides use (the database schema re-uses them). */
export const DIRECTIONS_LIST = ['horizontal', 'vertical', 'axial'] as const;
export const MODE_ORIGINS_LIST = ['typed', 'estimate', 'recording'] as const;
