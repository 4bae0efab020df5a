/**
 * Score bars: a score as a horizontal bar of block characters with eighth-cell resolution.
 *
 * Method: the bar length is `round(8 · width · score / max)` eighths, drawn as full blocks
 * (U+2588) followed by one partial block from U+2589..U+258F (the Unicode "Block Elements"
 * left-fraction blocks) and padded with a light shade track (U+2591), so the bar stays
 * readable without colour.
 * [Reference] The Unicode Standard, Block Elements chart U+2580–U+259F.
 */

/** Options of {@link scoreBar}. */
export const DEFAULTS = {
  /** The unfilled part of the track. */
  track: "░",
} as const;

// index i = i eighths filled (1..7)
const PARTIAL = ["", "▏", "▎", "▍", "▌", "▋", "▊", "▉"];

/** A bar of exactly `width` columns showing `score` relative to `max` (clamped to 0..1). */
export function scoreBar(score: number, max: number, width: number, track: string = DEFAULTS.track): string {
  if (width <= 0) return "";
  const ratio = max > 0 && Number.isFinite(score) ? Math.min(1, Math.max(0, score / max)) : 0;
  const eighths = Math.round(ratio * width * 8);
  const full = Math.floor(eighths / 8);
  const part = eighths % 8;
  const bar = "█".repeat(full) + PARTIAL[part]!;
  const used = full + (part > 0 ? 1 : 0);
  return bar + track.repeat(width - used);
}
