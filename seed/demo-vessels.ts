/**
 * Invented vessels of the demo with invented but physically plausible RAOs (docs/domain.md#vessel-response):
 * single-degree-of-freedom resonance shapes (common practice, no source). Heave tends to 1 at long
 *  periods; roll and pitch follow the wave slope (k = omega^2/g per metre of amplitude) times
 * a dynamic amplification at the natural period; short waves (shorter than the hull) cancel.
 */
import type { RaoTable } from '../shared/response';

const G = 9.81;
const PERIODS = Array.from({ length: 35 }, (_, i) => 3 + i * 0.5); // 3-20 s
const HEADINGS = [0, 30, 60, 90, 120, 150, 180]; // mirrored to port
const DEG = 180 / Math.PI;

const amplification = (tS: number, naturalS: number, damping: number) => {
  const r = naturalS / tS;
  return 1 / Math.sqrt((1 - r * r) ** 2 + (2 * damping * r) ** 2);
};
/** Hull cancellation: waves shorter than the hull move it little (wavelength / length, at most 1). */
const cancellation = (tS: number, lengthM: number) => Math.min(1, (G * tS * tS) / (2 * Math.PI) / lengthM);
/** Wave slope per metre of amplitude, deg: k = omega^2 / g. */
const slopeDeg = (tS: number) => (((2 * Math.PI) / tS) ** 2 / G) * DEG;
const round3 = (x: number) => Math.round(x * 1000) / 1000;

interface Hull {
  lengthM: number;
  heaveNaturalS: number;
  rollNaturalS: number;
  rollDamping: number;
  pitchNaturalS: number;
  /** A point on deck: distance forward of and out from the centre of motion, m. */
  point: { name: string; forwardM: number; outM: number };
}

function raoTable(h: Hull): RaoTable {
  const rad = (deg: number) => (deg * Math.PI) / 180;
  const at = (f: (t: number, beam: number, head: number) => number) =>
    HEADINGS.map((hd) => PERIODS.map((t) => round3(f(t, Math.abs(Math.sin(rad(hd))), Math.abs(Math.cos(rad(hd)))))));
  const heave = (t: number) => Math.min(1.6, amplification(t, h.heaveNaturalS, 0.35) * cancellation(t, h.lengthM));
  const roll = (t: number, beam: number) =>
    slopeDeg(t) * amplification(t, h.rollNaturalS, h.rollDamping) * beam * cancellation(t, h.lengthM / 3);
  const pitch = (t: number, _b: number, head: number) =>
    slopeDeg(t) * amplification(t, h.pitchNaturalS, 0.4) * head * cancellation(t, h.lengthM);
  // Vertical motion of the point from heave, pitch and roll (small angles), then velocity omega*z.
  const vel = (t: number, beam: number, head: number) => {
    const z = Math.hypot(heave(t), (pitch(t, beam, head) / DEG) * h.point.forwardM, (roll(t, beam) / DEG) * h.point.outM);
    return ((2 * Math.PI) / t) * z;
  };
  return {
    periodsS: PERIODS,
    headingsDeg: HEADINGS,
    responses: {
      heave_m_per_m: at(heave),
      roll_deg_per_m: at(roll),
      pitch_deg_per_m: at(pitch),
      [`vel_z_m_s_per_m@${h.point.name}`]: at(vel),
    },
  };
}

export const DEMO_VESSELS: { key: 'ctv' | 'layBarge'; name: string; raos: RaoTable }[] = [
  {
    key: 'ctv',
    name: 'CTV Sable Wren',
    // A ~26 m catamaran: short natural periods, stiff in roll.
    raos: raoTable({
      lengthM: 26,
      heaveNaturalS: 3.5,
      rollNaturalS: 4.5,
      rollDamping: 0.6,
      pitchNaturalS: 4,
      point: { name: 'bow_fender', forwardM: 12, outM: 0 },
    }),
  },
  {
    key: 'layBarge',
    name: 'Lay barge Kestrel Reach',
    // A ~70 m lay barge: roll peak near 9 s in beam seas.
    raos: raoTable({
      lengthM: 70,
      heaveNaturalS: 6.5,
      rollNaturalS: 9,
      rollDamping: 0.15,
      pitchNaturalS: 6,
      point: { name: 'lay_chute', forwardM: -33, outM: 0 },
    }),
  },
];
