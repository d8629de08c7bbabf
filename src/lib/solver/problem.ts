import { z } from 'zod';

/**
 * The plan engine's input: one practice's day, already reduced to integers (seconds since local
 * midnight, metres, cents). Validation lives here so that every other solver module can trust
 * its input and never has to guard against a malformed problem.
 */

const sec = z.number().int().min(0);
const nonNeg = z.number().finite().min(0);

const windowSchema = z
  .object({ startSec: sec, endSec: sec })
  .refine((w) => w.endSec >= w.startSec, { message: 'endSec must not be before startSec' });

const farrierSchema = z.object({
  id: z.string().min(1),
  startLocation: z.number().int().min(0),
  endLocation: z.number().int().min(0),
  shiftStartSec: sec,
  shiftEndSec: sec,
  breakSec: sec.default(0),
  breakWindow: windowSchema.nullable().default(null),
  /** Working seconds (home departure to home arrival, less the break) after which overtime starts. */
  normalWorkSec: sec,
  /** Hard limit on overtime seconds. */
  maxOvertimeSec: sec.default(0),
  /** Cents per second of driving. */
  costPerDriveSec: nonNeg.default(1),
  /** Cents per metre driven. */
  costPerMetre: nonNeg.default(0.04),
  /** Cents per second of overtime. */
  costPerOvertimeSec: nonNeg.default(1.5),
  /** Cents charged once when the farrier is given at least one stop. */
  fixedCost: nonNeg.default(0),
  qualified: z.boolean(),
  hasForge: z.boolean(),
  capacity: z.number().int().min(0).optional(),
});

const barnSchema = z.object({
  id: z.string().min(1),
  location: z.number().int().min(0),
  windows: z.array(windowSchema).min(1),
  setupSec: sec.default(0),
});

const pinSchema = z.object({
  farrierId: z.string().min(1),
  /** 1-based stop position in the farrier's route. */
  position: z.number().int().min(1).optional(),
  notBeforeSec: sec.optional(),
  notAfterSec: sec.optional(),
});

const jobSchema = z.object({
  id: z.string().min(1),
  barnId: z.string().min(1),
  durationSec: sec,
  needsQualified: z.boolean().default(false),
  needsForge: z.boolean().default(false),
  /** Weight of the job; leaving it out costs penalty × priority. Overdue horses get more. */
  priority: z.number().int().min(0).default(1),
  optional: z.boolean().default(false),
  /** Cents charged (times priority) when an optional job is left out. */
  penalty: nonNeg.default(0),
  windows: z.array(windowSchema).min(1).optional(),
  pin: pinSchema.optional(),
  demand: z.number().int().min(0).default(0),
});

/**
 * Zod schema of a problem. `windowMode` says what a barn's access window constrains:
 * `service-inside` (default) — every job at the barn must start and finish inside an access window;
 * `start-only` — every job must start inside a window and may run past its end (Solomon's rule).
 * `objective`: `weighted` sums the cost weights; `fleet-then-distance` first minimises the number of
 * farriers used, then the distance (the benchmark literature's hierarchical objective).
 */
export const problemSchema = z
  .object({
    locations: z.number().int().min(1),
    durationSec: z.array(z.array(sec)),
    distanceM: z.array(z.array(sec)),
    farriers: z.array(farrierSchema),
    barns: z.array(barnSchema),
    jobs: z.array(jobSchema),
    windowMode: z.enum(['service-inside', 'start-only']).default('service-inside'),
    objective: z.enum(['weighted', 'fleet-then-distance']).default('weighted'),
  })
  .superRefine((p, ctx) => {
    const n = p.locations;
    for (const key of ['durationSec', 'distanceM'] as const) {
      const m = p[key];
      if (m.length !== n) ctx.addIssue({ code: 'custom', path: [key], message: `needs ${n} rows, has ${m.length}` });
      m.forEach((row, i) => {
        if (row.length !== n) ctx.addIssue({ code: 'custom', path: [key, i], message: `needs ${n} columns, has ${row.length}` });
      });
    }
    const loc = (v: number, path: (string | number)[]) => {
      if (v >= n) ctx.addIssue({ code: 'custom', path, message: `location ${v} is outside 0..${n - 1}` });
    };
    const farrierIds = new Set<string>();
    p.farriers.forEach((f, i) => {
      if (farrierIds.has(f.id)) ctx.addIssue({ code: 'custom', path: ['farriers', i, 'id'], message: `duplicate farrier id ${f.id}` });
      farrierIds.add(f.id);
      loc(f.startLocation, ['farriers', i, 'startLocation']);
      loc(f.endLocation, ['farriers', i, 'endLocation']);
      if (f.shiftEndSec < f.shiftStartSec) ctx.addIssue({ code: 'custom', path: ['farriers', i, 'shiftEndSec'], message: 'shift ends before it starts' });
      if (f.breakSec > 0 && !f.breakWindow) ctx.addIssue({ code: 'custom', path: ['farriers', i, 'breakWindow'], message: 'a break needs a break window' });
    });
    const barnIds = new Set<string>();
    p.barns.forEach((b, i) => {
      if (barnIds.has(b.id)) ctx.addIssue({ code: 'custom', path: ['barns', i, 'id'], message: `duplicate barn id ${b.id}` });
      barnIds.add(b.id);
      loc(b.location, ['barns', i, 'location']);
    });
    const jobIds = new Set<string>();
    p.jobs.forEach((j, i) => {
      if (jobIds.has(j.id)) ctx.addIssue({ code: 'custom', path: ['jobs', i, 'id'], message: `duplicate job id ${j.id}` });
      jobIds.add(j.id);
      if (!barnIds.has(j.barnId)) ctx.addIssue({ code: 'custom', path: ['jobs', i, 'barnId'], message: `unknown barn ${j.barnId}` });
      if (j.pin && j.pin.notBeforeSec !== undefined && j.pin.notAfterSec !== undefined && j.pin.notAfterSec < j.pin.notBeforeSec) {
        ctx.addIssue({ code: 'custom', path: ['jobs', i, 'pin', 'notAfterSec'], message: 'notAfterSec is before notBeforeSec' });
      }
    });
  });

/** A validated, deeply frozen problem. Only `createProblem` makes one. */
export type Problem = Readonly<z.output<typeof problemSchema>> & { readonly __validated: true };
/** The shape callers write (defaults may be omitted). */
export type ProblemInput = z.input<typeof problemSchema>;
/** Validated parts of a problem, with defaults filled in. */
export type Farrier = Problem['farriers'][number];
export type Barn = Problem['barns'][number];
export type Job = Problem['jobs'][number];
/** A closed interval of seconds since local midnight. */
export type TimeWindow = { startSec: number; endSec: number };

/** One reason a problem was rejected, with the path of the offending field. */
export interface ProblemIssue {
  path: string;
  message: string;
}

/** Thrown by `createProblem` for malformed input; `issues` lists every problem found, not just the first. */
export class ProblemError extends Error {
  readonly code = 'invalid_problem';
  constructor(readonly issues: ProblemIssue[]) {
    super(`invalid problem: ${issues.slice(0, 5).map((i) => `${i.path || '(root)'}: ${i.message}`).join('; ')}${issues.length > 5 ? ` (+${issues.length - 5} more)` : ''}`);
    this.name = 'ProblemError';
  }
}

function deepFreeze<T>(o: T): T {
  if (o && typeof o === 'object' && !Object.isFrozen(o)) {
    Object.freeze(o);
    for (const v of Object.values(o as object)) deepFreeze(v);
  }
  return o;
}

/**
 * Validates raw input and returns an immutable problem. Throws `ProblemError` (never a bare zod error
 * or a crash) so that an endpoint can turn it into a 400 with field paths.
 */
export function createProblem(input: unknown): Problem {
  if (input && typeof input === 'object' && (input as { __validated?: boolean }).__validated === true && Object.isFrozen(input)) {
    return input as Problem;
  }
  const parsed = problemSchema.safeParse(input);
  if (!parsed.success) {
    throw new ProblemError(parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })));
  }
  const p = { ...parsed.data, __validated: true as const };
  return deepFreeze(p) as Problem;
}
