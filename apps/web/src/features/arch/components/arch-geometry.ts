import { isPrimaryTooth, toothArch, type ToothArch, toothKind, type ToothKind } from '@torquetrail/domain';

/** One tooth position laid out on its arch, in SVG user units. */
export interface ArchCell {
  fdi: number;
  arch: ToothArch;
  /** 0-based place from the viewer's left within its arch (drawing order). */
  column: number;
  kind: ToothKind;
  /** Centre of the cell. */
  x: number;
  y: number;
  /** Along the curve. */
  width: number;
  /** Across the curve. */
  height: number;
  /** Degrees; the cell's width follows the curve's tangent. */
  rotation: number;
  /** Unit normal pointing away from the arch's inside. */
  outward: { x: number; y: number };
  /** Where the tooth number goes: beside the cell, outside the curve. */
  label: { x: number; y: number };
}

export interface ArchLayout {
  width: number;
  height: number;
  cells: ArchCell[];
}

const ARCH_VIEW = { width: 640, height: 600 } as const;

const CENTRE_X = ARCH_VIEW.width / 2;
/** Half the span of each arch's curve and its depth (apex to arm ends). */
const HALF_SPAN = 240;
const DEPTH = 200;
const UPPER_APEX_Y = 64;
const LOWER_APEX_Y = ARCH_VIEW.height - 64;
const GAP = 5;
const LABEL_OFFSET = 17;
/** Natural cell sizes per kind before fitting to the curve. */
const CELL_SIZE: Record<ToothKind, { width: number; height: number }> = {
  molar: { width: 40, height: 42 },
  premolar: { width: 30, height: 38 },
  canine: { width: 28, height: 37 },
  incisor: { width: 26, height: 35 },
};
/** Never blow cells up more than this, e.g. for the 10-tooth primary arches. */
const MAX_SCALE = 1.25;

const PARABOLA_A = DEPTH / (HALF_SPAN * HALF_SPAN);
const SAMPLES = 1200;

/**
 * The arch curve: a parabola y = apex ± a·(x − cx)², opening downwards on screen for the
 * lower arch (a ∪ with its apex at the bottom) and upwards for the upper (a ∩ at the top),
 * as seen facing the patient. Sampled once for arc-length lookups.
 */
interface Curve {
  sign: 1 | -1;
  apexY: number;
  /** Cumulative arc length at each sample. */
  lengths: Float64Array;
  xs: Float64Array;
}

function makeCurve(arch: ToothArch): Curve {
  const sign = arch === 'upper' ? 1 : -1;
  const apexY = arch === 'upper' ? UPPER_APEX_Y : LOWER_APEX_Y;
  const xs = new Float64Array(SAMPLES + 1);
  const lengths = new Float64Array(SAMPLES + 1);
  for (let i = 0; i <= SAMPLES; i++) {
    xs[i] = CENTRE_X - HALF_SPAN + (2 * HALF_SPAN * i) / SAMPLES;
    if (i > 0) {
      const dx = xs[i] - xs[i - 1];
      const dy = curveY(sign, apexY, xs[i]) - curveY(sign, apexY, xs[i - 1]);
      lengths[i] = lengths[i - 1] + Math.hypot(dx, dy);
    }
  }
  return { sign, apexY, xs, lengths };
}

function curveY(sign: 1 | -1, apexY: number, x: number): number {
  return apexY + sign * PARABOLA_A * (x - CENTRE_X) ** 2;
}

/** Point, tangent slope and outward normal at arc length `s` from the curve's left end. */
function pointAt(curve: Curve, s: number) {
  const { xs, lengths } = curve;
  let lo = 0;
  let hi = lengths.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (lengths[mid] < s) lo = mid;
    else hi = mid;
  }
  const t = (s - lengths[lo]) / (lengths[hi] - lengths[lo] || 1);
  const x = xs[lo] + t * (xs[hi] - xs[lo]);
  const y = curveY(curve.sign, curve.apexY, x);
  const slope = curve.sign * 2 * PARABOLA_A * (x - CENTRE_X);
  const norm = Math.hypot(1, slope);
  // Upper (∩): outward is up and out, (m, −1); lower (∪): down and out, (−m, 1).
  const outward = curve.sign === 1 ? { x: slope / norm, y: -1 / norm } : { x: -slope / norm, y: 1 / norm };
  return { x, y, rotation: (Math.atan(slope) * 180) / Math.PI, outward };
}

/** The patient's right (quadrants 1, 4, 5, 8) is on the viewer's left. */
function onViewersLeft(fdi: number): boolean {
  const quadrant = Math.floor(fdi / 10);
  return quadrant === 1 || quadrant === 4 || quadrant === 5 || quadrant === 8;
}

/**
 * Lays out tooth positions (e.g. TOOTH_POSITIONS_PERMANENT) along two U-shaped arches, the upper
 * above the lower, seen facing the patient (FDI 18 far left on the upper arch, 48 far left on the
 * lower). Cells sit by arc length from the midline outwards, wider for molars than premolars than
 * canines and incisors, each rotated to the curve's tangent. Pure: same input, same layout.
 */
export function layoutArches(positions: readonly number[]): ArchLayout {
  const curves = { upper: makeCurve('upper'), lower: makeCurve('lower') };
  const halfArc = curves.upper.lengths[SAMPLES] / 2;
  const cells: ArchCell[] = [];

  for (const arch of ['upper', 'lower'] as const) {
    const inArch = positions.filter((fdi) => toothArch(fdi) === arch);
    const sides = [inArch.filter(onViewersLeft), inArch.filter((fdi) => !onViewersLeft(fdi))];
    // One scale for the whole arch, so that both sides (and both arches) look alike.
    const sideUnits = (side: number[]) => (side.length === 0 ? 0 : isPrimaryTooth(side[0]) ? 5 : 8);
    const naturalSpan = (side: number[]) => {
      let sum = 0;
      for (let unit = 1; unit <= sideUnits(side); unit++)
        sum += CELL_SIZE[toothKind(side[0] - (side[0] % 10) + unit)].width;
      return { sum, gaps: sideUnits(side) * GAP };
    };
    const spans = sides.map(naturalSpan);
    const scale = Math.min(
      MAX_SCALE,
      ...spans.filter((span) => span.sum > 0).map((span) => (halfArc * 0.97 - span.gaps) / span.sum),
    );

    const archCells: ArchCell[] = [];
    sides.forEach((side, sideIndex) => {
      if (side.length === 0) return;
      const quadrantBase = side[0] - (side[0] % 10);
      const direction = sideIndex === 0 ? -1 : 1;
      let fromMidline = GAP / 2;
      for (let unit = 1; unit <= sideUnits(side); unit++) {
        const fdi = quadrantBase + unit;
        const kind = toothKind(fdi);
        const width = CELL_SIZE[kind].width * scale;
        const height = CELL_SIZE[kind].height * Math.min(scale, 1.1);
        const centre = fromMidline + width / 2;
        fromMidline += width + GAP;
        if (!side.includes(fdi)) continue;
        const point = pointAt(curves[arch], halfArc + direction * centre);
        const labelDistance = height / 2 + LABEL_OFFSET;
        archCells.push({
          fdi,
          arch,
          column: 0,
          kind,
          x: point.x,
          y: point.y,
          width,
          height,
          rotation: point.rotation,
          outward: point.outward,
          label: { x: point.x + point.outward.x * labelDistance, y: point.y + point.outward.y * labelDistance },
        });
      }
    });
    archCells.sort((a, b) => a.x - b.x).forEach((cell, column) => cells.push({ ...cell, column }));
  }

  return { ...ARCH_VIEW, cells };
}
