import { z } from 'zod';

/**
 * Request and answer shapes of the plans API, shared by the endpoints and the dispatch board so that
 * both agree on field names and limits.
 */

const isoDate = z
  .string({ required_error: 'Give the plan date as YYYY-MM-DD' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use YYYY-MM-DD')
  .refine((s) => {
    const d = new Date(`${s}T00:00:00Z`);
    return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
  }, 'Not a calendar date');

/** Seconds the plan engine may search; the screen's default is 5. */
export const DEFAULT_BUDGET_SECONDS = 5;

const budgetSeconds = z.number().min(0.2, 'At least 0.2 s').max(60, 'At most 60 s').optional();
const version = z.number({ required_error: 'Give the version you edited', invalid_type_error: 'A whole number' }).int().min(1);

/** POST /api/plans */
export const createPlanSchema = z.object({ date: isoDate, budgetSeconds }).strict();

/** POST /api/plans/[id]/replan — re-solves around the pinned jobs. */
export const replanSchema = z.object({ version, budgetSeconds }).strict();

/** GET /api/plans?date= and GET /api/plans/progress?date= */
export const planDateQuerySchema = z.object({ date: isoDate }).strict();

/**
 * One move of a job: to a farrier's route (toFarrierId) or off the plan (toFarrierId null), optionally
 * at a 1-based stop position; `pin` true pins the job to that farrier, false removes a pin.
 */
export const moveSchema = z
  .object({
    jobId: z.number({ required_error: 'Give the job id' }).int().positive(),
    toFarrierId: z.number({ required_error: 'Give the farrier id, or null for unplanned' }).int().positive().nullable(),
    position: z.number().int().min(1).max(200).optional(),
    pin: z.boolean().optional(),
  })
  .strict();

/** PATCH /api/plans/[id] */
export const patchPlanSchema = z
  .object({ version, moves: z.array(moveSchema, { required_error: 'Give at least one move' }).min(1, 'Give at least one move').max(200) })
  .strict();

/** POST /api/plans/[id]/publish */
export const publishPlanSchema = z.object({ version }).strict();

export type CreatePlanInput = z.infer<typeof createPlanSchema>;
export type PatchPlanInput = z.infer<typeof patchPlanSchema>;
export type Move = z.infer<typeof moveSchema>;

/** A rule a route breaks after a hand edit, in words, with a stable code for the screen. */
export interface PlanWarning {
  code: 'barn_closed' | 'owner_window' | 'past_shift' | 'overtime_limit' | 'no_forge' | 'not_qualified' | 'pinned_elsewhere' | 'pin_position' | 'break_missed' | 'other';
  message: string;
  jobId?: number;
}

/** A job as the board shows it. */
export interface PlanJobView {
  id: number;
  horseId: number;
  horseName: string;
  ownerName: string;
  workTypes: string[];
  minutes: number;
  dueOn: string;
  lame: boolean;
  pinned: boolean;
  pinnedPosition: number | null;
  /** Short safety notes (hot fit, second person, therapeutic work, lameness). */
  cautions: string[];
}

export interface PlanStopView {
  id: number;
  position: number;
  barnId: number;
  barnName: string;
  lat: number;
  lon: number;
  /** ISO 8601 with the practice's offset. */
  arrival: string;
  start: string;
  departure: string;
  legDriveMinutes: number;
  /** Distance of the leg into this stop, in the practice's units. */
  legDistance: number;
  window: { start: string; end: string } | null;
  minutes: number;
  jobs: PlanJobView[];
  warnings: PlanWarning[];
  /** What the farrier has marked on the day sheet for this stop, or null before any mark. */
  progress: { state: 'arrived' | 'done' | 'skipped'; arrived: string | null; departed: string | null; skipReason: string | null } | null;
}

export interface PlanRouteView {
  id: number;
  farrierId: number;
  farrierName: string;
  colour: string;
  home: { lat: number; lon: number };
  hasForge: boolean;
  qualified: boolean;
  apprentice: boolean;
  start: string;
  end: string;
  breakStart: string | null;
  driveMinutes: number;
  distance: number;
  workMinutes: number;
  overtimeMinutes: number;
  horses: number;
  stops: PlanStopView[];
  warnings: PlanWarning[];
  cautions: string[];
}

export interface UnplannedView {
  jobId: number;
  reason: string;
  /** The reason in plain words. */
  reasonText: string;
  job: PlanJobView;
  barnId: number;
  barnName: string;
}

export interface PlanView {
  id: number;
  date: string;
  state: 'draft' | 'published';
  version: number;
  publishedAt: string | null;
  timeZone: string;
  units: 'miles' | 'km';
  routes: PlanRouteView[];
  unplanned: UnplannedView[];
  figures: {
    driveMinutes: number;
    distance: number;
    overtimeMinutes: number;
    horses: number;
    stops: number;
    solveSeconds: number | null;
    iterations: number | null;
    budgetSeconds: number | null;
  };
  /** Milliseconds the server spent re-timing on the last edit, when this answer follows a PATCH. */
  retimeMs?: number;
}

/** Progress of a planning run, polled by the board while the engine works. */
export interface PlanProgressView {
  running: boolean;
  seconds: number;
  budgetSeconds: number;
  iterations: number;
  unplanned: number;
  farriersUsed: number;
  phase: string;
}
