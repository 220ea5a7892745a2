// The design and combination standards a project can follow (stored as PostgreSQL enums, db/schema/core.ts).
export const DESIGN_STANDARDS = ["AISC360-22", "EN1993-1-1"] as const;
export const COMBINATION_STANDARDS = ["ASCE7-22", "EN1990"] as const;
