/**
 * The time budget of one question: a wall-clock deadline that the stages which can run long
 * (conditions over every entity of a type, paths, clue ablation, suggested clues, why-not,
 * the re-asks that check suggestions) look at between units of work, stopping early and
 * naming what they cut. The answer so far is returned with a note and the JSON field
 * `budget` (README "Time budget"). Checking a clock between units of work is common practice
 * for interactive tools (anytime algorithms: Dean & Boddy, "An analysis of time-dependent
 * planning", AAAI 1988).
 */

/** Defaults of the time budget. */
export const DEFAULTS = {
  /** Milliseconds a question may take before the long stages stop early (0: no limit). */
  timeLimitMs: 3000,
} as const;

/** The stages a deadline can cut, in the order they run. */
export type CutStage = "linking" | "ranking" | "conditions" | "other senses" | "paths" | "ablation" | "suggestions" | "why-not" | "suggestion checks";

/** A question's deadline: `expired()` is cheap enough to call in a loop. */
export class Deadline {
  /** The budget in milliseconds (0: none). */
  readonly limitMs: number;
  private readonly end: number;
  private readonly clock: () => number;
  private readonly cutStages = new Set<CutStage>();

  constructor(limitMs: number = DEFAULTS.timeLimitMs, clock: () => number = () => performance.now()) {
    if (!Number.isFinite(limitMs) || limitMs < 0) throw new RangeError(`time limit must be a non-negative number of milliseconds, got ${limitMs}`);
    this.limitMs = limitMs;
    this.clock = clock;
    this.end = limitMs === 0 ? Infinity : clock() + limitMs;
  }

  /** A deadline that never expires. */
  static none(): Deadline {
    return new Deadline(0);
  }

  /** True once the budget is spent. */
  expired(): boolean {
    return this.end !== Infinity && this.clock() >= this.end;
  }

  /** Milliseconds left (Infinity without a limit, 0 when spent). */
  remaining(): number {
    return this.end === Infinity ? Infinity : Math.max(0, this.end - this.clock());
  }

  /** Records that `stage` stopped early (or did not run) because the budget was spent. */
  cut(stage: CutStage): void {
    this.cutStages.add(stage);
  }

  /** True (and `stage` recorded as cut) when the budget is spent: `if (deadline.stop("ablation")) …`. */
  stop(stage: CutStage): boolean {
    if (!this.expired()) return false;
    this.cut(stage);
    return true;
  }

  /** The stages cut so far, in the order they run. */
  get cuts(): CutStage[] {
    const order: CutStage[] = ["linking", "ranking", "conditions", "other senses", "paths", "ablation", "suggestions", "why-not", "suggestion checks"];
    return order.filter((s) => this.cutStages.has(s));
  }

  /** True when some stage was cut. */
  get hit(): boolean {
    return this.cutStages.size > 0;
  }
}
