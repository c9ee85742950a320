/**
 * Gridcue's grid palette (product.md "Look and words"): the values GridBoard's stylesheet falls back to, written
 * once here for the pictures drawn outside the browser (grid-svg.ts). A change here goes into that stylesheet too.
 */
export const PALETTE = {
  /** the app's page background (sand 50), behind a picture's grid */
  page: '#FAF8F5',
  paper: '#FFFFFF',
  ink: '#1F2430',
  deduced: '#0F766E',
  candidate: '#64748B',
  /** slate on amber or lilac falls under 4.5:1, so marks in tinted cells take the next slate step */
  candidateOnTint: '#475569',
  focus: '#FDE68A',
  focusRing: '#92400E',
  reason: '#EDE4FB',
  reasonHatch: '#8B74C9',
  reasonLine: '#7C64C0',
  eliminated: '#BE123C',
  error: '#FFE4E6',
  thermo: '#DDD3C4',
  thermoBulb: '#C2B49D',
  thinLine: '#94A3B8',
} as const
