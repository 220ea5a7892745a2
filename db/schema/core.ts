import { sql } from "drizzle-orm";
import { bigint, check, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid, varchar } from "drizzle-orm/pg-core";
import { ROLES } from "../../lib/permissions";
import { COMBINATION_STANDARDS, DESIGN_STANDARDS } from "../../lib/projects/standards";
import { DEFAULT_DEFLECTION_LIMIT, DEFLECTION_LIMIT_BOUNDS } from "../../lib/projects/deflection-limit";

/** createdAt/updatedAt columns shared by every table. */
export const timestamps = {
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp({ withTimezone: true })
    .notNull()
    .defaultNow()
    .$onUpdate(() => new Date()),
};

export const projectRole = pgEnum("project_role", ROLES);
export const designStandard = pgEnum("design_standard", DESIGN_STANDARDS);
export const combinationStandard = pgEnum("combination_standard", COMBINATION_STANDARDS);

export const users = pgTable("users", {
  id: uuid().primaryKey().defaultRandom(),
  // Stored lower-cased (see db/queries/users.ts) so the unique index is case-insensitive in effect.
  email: text().notNull().unique(),
  name: text().notNull(),
  passwordHash: text().notNull(),
  // Every session carries the version it was issued under; a password change, "sign out everywhere" or signing
  // out raises it, and older sessions stop working on their next request (lib/auth/session.ts).
  sessionVersion: integer().notNull().default(0),
  ...timestamps,
});

/**
 * rate-limiter-flexible's PostgreSQL store for the sign-in limits (lib/auth/sign-in-limits.ts), in the library's
 * own layout (RateLimiterPostgres), so the limits hold across every web process.
 */
export const signInLimits = pgTable("sign_in_limits", {
  key: varchar({ length: 255 }).primaryKey(),
  points: integer().notNull().default(0),
  expire: bigint({ mode: "number" }),
});

export const organizations = pgTable("organizations", {
  id: uuid().primaryKey().defaultRandom(),
  name: text().notNull().unique(),
  ...timestamps,
});

export const projects = pgTable(
  "projects",
  {
    id: uuid().primaryKey().defaultRandom(),
    organizationId: uuid()
      .notNull()
      .references(() => organizations.id, { onDelete: "cascade" }),
    name: text().notNull(),
    description: text().notNull().default(""),
    designStandard: designStandard().notNull().default("EN1993-1-1"),
    combinationStandard: combinationStandard().notNull().default("EN1990"),
    /** The N in the serviceability deflection limit span/N (lib/projects/deflection-limit.ts states the default and bounds). */
    deflectionLimit: integer().notNull().default(DEFAULT_DEFLECTION_LIMIT),
    ...timestamps,
  },
  (t) => [
    uniqueIndex("projects_organization_name_idx").on(t.organizationId, t.name),
    check("projects_deflection_limit_bounds", sql`${t.deflectionLimit} between ${sql.raw(String(DEFLECTION_LIMIT_BOUNDS.min))} and ${sql.raw(String(DEFLECTION_LIMIT_BOUNDS.max))}`),
  ],
);

export const memberships = pgTable(
  "memberships",
  {
    id: uuid().primaryKey().defaultRandom(),
    projectId: uuid()
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    role: projectRole().notNull(),
    ...timestamps,
  },
  (t) => [uniqueIndex("memberships_project_user_idx").on(t.projectId, t.userId), index("memberships_user_idx").on(t.userId)],
);

export const invitations = pgTable(
  "invitations",
  {
    id: uuid().primaryKey().defaultRandom(),
    projectId: uuid()
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    email: text().notNull(),
    role: projectRole().notNull(),
    // SHA-256 of the token in the join link; the token itself is never stored.
    tokenHash: text().notNull().unique(),
    invitedBy: uuid()
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    acceptedAt: timestamp({ withTimezone: true }),
    acceptedBy: uuid().references(() => users.id, { onDelete: "set null" }),
    ...timestamps,
  },
  (t) => [index("invitations_project_idx").on(t.projectId)],
);

export const auditEvents = pgTable(
  "audit_events",
  {
    id: uuid().primaryKey().defaultRandom(),
    projectId: uuid().references(() => projects.id, { onDelete: "cascade" }),
    actorId: uuid().references(() => users.id, { onDelete: "set null" }),
    action: text().notNull(),
    subjectType: text().notNull(),
    subjectId: text().notNull(),
    details: jsonb().$type<Record<string, unknown>>().notNull().default({}),
    ...timestamps,
  },
  (t) => [index("audit_events_project_idx").on(t.projectId, t.createdAt)],
);

export type User = typeof users.$inferSelect;
export type NewUser = typeof users.$inferInsert;
export type Organization = typeof organizations.$inferSelect;
export type Project = typeof projects.$inferSelect;
export type NewProject = typeof projects.$inferInsert;
export type Membership = typeof memberships.$inferSelect;
export type Invitation = typeof invitations.$inferSelect;
export type AuditEvent = typeof auditEvents.$inferSelect;
