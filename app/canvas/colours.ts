/** The canvas's colours (naming.md, "Colours"). */
export const INK = '#1b1b1f';
/** Strokes are drawn at 70 % over the photo, as one layer, so overlaps do not darken. */
export const INK_OPACITY = 0.7;
export const RESTORED = '#6b7280';
export const SELECTION = '#0f9d8a';
export const HALO = '#ffffff';
/** Box of a doubtful letter; a clear letter's box is teal (SELECTION). */
export const DOUBTFUL = '#b7791f';
