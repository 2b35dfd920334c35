// The JSON the server sends and the viewer reads: one contract for both shells. Types only.
import type { UnitSystem } from './units.ts';
import type { ProductLabel } from './product-label.ts';
import type { Catalog, Formula, Plan } from './model.ts';
import type { Permission, Role } from './permissions.ts';
import type { ScaleResult, ScaleTarget } from './scale.ts';
import type { Sheet } from './sheet/types.ts';
import type { FormulaDiff } from './diff.ts';
import type { FormulaFigures } from './figures.ts';
import type { AllergenSummary } from './allergens.ts';
import type { Caution } from './cautions.ts';
import type { MixWater } from './dough-water.ts';
import type { CostSummary } from './cost.ts';
import type { FrictionProposal, MixFriction } from './friction.ts';
import type { RecordKind, RecordTarget } from './records.ts';

/** Every error response: `error` is a stable code, `message` is for people. */
export interface ApiError {
  error: 'unauthenticated' | 'forbidden' | 'not_found' | 'invalid' | 'rate_limited' | 'conflict' | 'payload_too_large' | 'internal';
  message: string;
  requiredPermission?: Permission;
  issues?: { path: string; message: string }[];
}

export interface UserInfo {
  id: number;
  email: string;
  name: string;
  role: Role;
}

/** GET /api/me, POST /api/session */
export interface Me {
  user: UserInfo;
  permissions: Permission[];
  /** The units this person reads weights and temperatures in (PUT /api/me/preferences). */
  unitSystem: UnitSystem;
}

/** PUT /api/me/preferences */
export interface PreferencesBody {
  unitSystem: UnitSystem;
}

/** An account as admins see it (GET /api/users). */
export interface AccountSummary extends UserInfo {
  createdAt: string;
  passwordChangedAt: string;
}

export interface AccountListResponse {
  users: AccountSummary[];
}

/** POST /api/users's body; the person gets an e-mail with a link to set a password. */
export interface NewAccount {
  email: string;
  name: string;
  role: Role;
}

/** One change to an account: who did it, when, what. */
export interface AuditEntry {
  id: number;
  at: string;
  actor: string;
  action: 'account.add' | 'account.role' | 'account.remove' | 'account.reset-link' | 'account.password' | string;
  target: string;
  detail: string;
}

export interface AuditListResponse {
  entries: AuditEntry[];
}

/** Figures of a formula's reference batch (or of a scaled batch). */
export type { FormulaFigures };

export interface FormulaSummary {
  id: string;
  title: string;
  status: string;
  category: string;
  tags: string[];
  figures: FormulaFigures;
  revision: number;
  updatedAt: string;
}

/** GET /api/formulas?q=&category=&tag=&status= */
export interface FormulaListResponse {
  formulas: FormulaSummary[];
  categories: string[];
  tags: string[];
}

/** GET /api/formulas/:id/water?room=&flour=&tap=&rise=|friction=[&ddt=][&preferment=..][&plan=&mixer=][&pieces=..] */
export interface FormulaWater {
  formula: string;
  target: ScaleTarget;
  /** Where room, flour, tap and the rise came from: the query, or the plan's conditions and mixer. */
  plan: { date: string; mixer: string } | null;
  /** °C; grams for weights. */
  water: MixWater;
}

/** GET /api/formulas/:id[?pieces=&piece=|?mix=] */
export interface FormulaDetail {
  formula: Formula;
  /** Catalog entries this formula uses; prices removed unless the role has read:cost. */
  catalog: Catalog;
  scaled: ScaleResult;
  reference: FormulaFigures;
  allergens: AllergenSummary;
  /** null unless the role has read:cost. */
  cost: CostSummary | null;
  /** Ingredient statement and nutrition, EU and US; null unless the role has read:label. */
  label: ProductLabel | null;
  /** The usual cautions for the work (shared/cautions.ts), each with its topic. */
  cautions: Caution[];
  revision: number;
  updatedAt: string;
  path: string;
}

/** The commit a revision was loaded from, when the formulas folder is a git repository. */
export interface RevisionCommit {
  gitCommit: string | null;
  gitAuthor: string | null;
  /** The commit's author date (ISO 8601). */
  gitDate: string | null;
  /** The commit message's subject line. */
  gitMessage: string | null;
}

export interface RevisionSummary extends RevisionCommit {
  revision: number;
  contentHash: string;
  loadedAt: string;
  figures: FormulaFigures;
}

/** GET /api/formulas/:id/revisions */
export interface RevisionListResponse {
  formula: string;
  revisions: RevisionSummary[];
}

/** GET /api/formulas/:id/diff?from=&to= */
export interface RevisionDiffResponse {
  formula: string;
  from: number;
  to: number;
  /** Each side's commit: why it changed. */
  commits: { from: RevisionCommit; to: RevisionCommit };
  diff: FormulaDiff;
}

/** GET /api/changes: the newest revisions across formulas */
export interface ChangeListResponse {
  changes: (RevisionSummary & { formula: string; title: string })[];
}

export interface PlanSummary {
  date: string;
  readyBy: string;
  orders: number;
  /** Formula ids, each once, in the order of the plan. */
  formulas: string[];
  /** The products' titles, in the same order. */
  titles: string[];
  /** The plan's own notes, when it has some. */
  notes?: string;
}

/** GET /api/plans */
export interface PlanListResponse {
  plans: PlanSummary[];
}

/** GET /api/plans/:date */
export interface PlanDetail {
  plan: Plan;
  sheet: Sheet;
}

/** GET /api/catalog */
export interface CatalogResponse {
  catalog: Catalog;
  /** The formulas this person may open that use each ingredient (directly, in a blend or as a levain's feed). */
  usedBy: Record<string, { id: string; title: string }[]>;
}

/** A photo of a bench record (GET /api/records/:id/photos/:n, `?size=preview` for the small one). */
export interface RecordPhoto {
  n: number;
  contentType: string;
  width: number;
  height: number;
  bytes: number;
  url: string;
  previewUrl: string;
}

/** One bench record (POST /api/plans/:date/records answers `{ record }`). Temperatures °C. */
export interface BenchRecord {
  id: number;
  date: string;
  target: string;
  kind: RecordKind;
  label: string;
  formula: string | null;
  mixer: string | null;
  doughTemperature: number | null;
  waterTemperature: number | null;
  ripe: boolean | null;
  note: string;
  initials: string;
  recordedAt: string;
  createdAt: string;
  by: { id: number | null; name: string; email: string };
  clientId: string | null;
  corrects: number | null;
  correctedBy: number | null;
  hidden: { by: string; at: string; reason: string } | null;
  photos: RecordPhoto[];
  friction: MixFriction | null;
}

export interface RecordResponse {
  record: BenchRecord;
}

/** GET /api/plans/:date/records */
export interface RecordListResponse {
  date: string;
  targets: Omit<RecordTarget, 'inputs'>[];
  records: BenchRecord[];
}

/** GET /api/friction */
export interface FrictionResponse {
  minimum: number;
  rule: string;
  proposals: FrictionProposal[];
}
