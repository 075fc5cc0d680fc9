/*
 * Field profile: |E|² through the stack relative to the incident wave, at one wavelength and angle,
 * for laser-damage and durability checks (standing-wave peaks at interfaces). The substrate is
 * semi-infinite here (the coherent front surface); depth 0 is the front of the first layer, depth
 * grows towards the substrate, negative depths lie in the incident medium.
 *
 * Method: tangential E and H (H in units of the free-space admittance) at every interface from the
 * characteristic matrices (Macleod, ch. 2), then inside a medium [E; H](z) = M(u)·[E; H](z_back)
 * with u the distance to the region's back interface. For p the normal component follows from
 * Maxwell's equations, E_z = −β H_y / N², and |E|² = |E_x|² + |E_z|².
 */
import { Complex } from 'complex.js';
import { finiteNumber, incidenceAngle, oneOf, positiveNumber } from './checks.js';
import { indexAt } from './dispersion.js';
import { OpticsInputError, fieldPath } from './errors.js';
import { referenceNormalComponent, referenceAdmittance } from './reference.js';
import { stackThicknessNm, validateOpticalStack, type OpticalStack } from './stack.js';

interface Medium {
  N: Complex;
  q: Complex;
  eta: Complex;
}

/**
 * |E|²/|E_incident|² at each depth.
 *
 * @param out receives one value per entry of depthsNm (same length or longer).
 * @param wavelengthNm vacuum wavelength, nm; @param angleDeg angle of incidence, degrees;
 * @param polarisation 's' or 'p' (for unpolarised light average the two profiles).
 * @param depthsNm depths in nm from the front of the first layer (negative: incident medium;
 *   beyond the last layer: substrate).
 * @returns out.
 */
export function fieldProfile(
  out: Float64Array,
  stack: OpticalStack,
  wavelengthNm: number,
  angleDeg: number,
  polarisation: 's' | 'p',
  depthsNm: ArrayLike<number>,
): Float64Array {
  const checked = validateOpticalStack(stack);
  positiveNumber(wavelengthNm, 'wavelengthNm');
  const theta = (incidenceAngle(angleDeg, 'angleDeg') * Math.PI) / 180;
  const pol = oneOf(polarisation, ['s', 'p'] as const, 'polarisation');
  if (out.length < depthsNm.length) {
    throw new OpticsInputError('out', `must hold ${depthsNm.length} values (got ${out.length})`);
  }
  for (let i = 0; i < depthsNm.length; i++) finiteNumber(depthsNm[i], fieldPath('depthsNm', i));

  const n0 = indexAt(checked.incident, wavelengthNm, 'incident');
  if (n0.k !== 0) throw new OpticsInputError('incident', 'the incident medium must be lossless (k = 0)');
  const beta = n0.n * Math.sin(theta);
  const k0 = (2 * Math.PI) / wavelengthNm;
  const medium = (model: Parameters<typeof indexAt>[0], field: string): Medium => {
    const { n, k } = indexAt(model, wavelengthNm, field);
    const N = new Complex(n, k);
    const q = referenceNormalComponent(N, beta);
    return { N, q, eta: referenceAdmittance(N, q, pol) };
  };
  const incident = medium(checked.incident, 'incident');
  const layers = checked.layers.map((layer, i) => medium(layer.material, fieldPath('layers', i)));
  const substrate = medium(checked.substrate, 'substrate');

  // Interface positions z[0] = 0 … z[L] = D and the tangential fields there, from the substrate side
  // with E = 1 just inside the substrate. The fields grow without bound towards the front of an
  // opaque stack (a thick absorber, a long tunnelling gap), so each interface's pair is divided by
  // its larger magnitude and the natural log of the divisor kept: true (E, H) = scaled · e^logScale.
  const L = layers.length;
  const z = new Float64Array(L + 1);
  for (let i = 0; i < L; i++) z[i + 1] = z[i] + checked.layers[i].thicknessNm;
  const E: Complex[] = new Array<Complex>(L + 1);
  const H: Complex[] = new Array<Complex>(L + 1);
  const logScale = new Float64Array(L + 1);
  E[L] = new Complex(1, 0);
  H[L] = substrate.eta;
  for (let i = L - 1; i >= 0; i--) {
    const [e, h] = acrossMedium(layers[i], k0 * checked.layers[i].thicknessNm, E[i + 1], H[i + 1]);
    const m = Math.max(e.abs(), h.abs());
    const f = m > 0 && Number.isFinite(m) ? m : 1;
    E[i] = e.div(f);
    H[i] = h.div(f);
    logScale[i] = logScale[i + 1] + Math.log(f);
  }
  // Incident tangential amplitude (scaled by e^logScale[0]): E = E⁺ + E⁻, H = η₀(E⁺ − E⁻) at z = 0.
  const incidentE = incident.eta.mul(E[0]).add(H[0]).div(incident.eta.mul(2));
  // |E_incident| of the whole wave: for p the tangential part is E cos θ₀.
  const cos0 = Math.cos(theta);
  const incidentAmplitude = incidentE.abs() / (pol === 'p' ? cos0 : 1);

  for (let s = 0; s < depthsNm.length; s++) {
    const depth = depthsNm[s];
    let Ez: Complex;
    let Hz: Complex;
    let N: Complex;
    let at: number;
    if (depth < 0) {
      [Ez, Hz] = acrossMedium(incident, -k0 * depth, E[0], H[0]);
      N = incident.N;
      at = 0;
    } else if (depth >= z[L]) {
      // Only the forward wave in the substrate: E(z) = E(D) exp(i k0 q (z − D)).
      const phase = substrate.q.mul(new Complex(0, k0 * (depth - z[L]))).exp();
      Ez = E[L].mul(phase);
      Hz = substrate.eta.mul(Ez);
      N = substrate.N;
      at = L;
    } else {
      let j = 0;
      while (depth >= z[j + 1]) j++;
      [Ez, Hz] = acrossMedium(layers[j], k0 * (z[j + 1] - depth), E[j + 1], H[j + 1]);
      N = layers[j].N;
      at = j + 1;
    }
    // Ratios before squaring, so neither the scaled fields nor e^(2·log) overflow.
    const factor = Math.exp(logScale[at] - logScale[0]) / incidentAmplitude;
    let e2 = (Ez.abs() * factor) ** 2;
    if (pol === 'p') e2 += ((beta * Hz.abs() * factor) / N.abs() ** 2) ** 2;
    out[s] = e2;
  }
  return out;
}

/** Fields at the front of a slab of `medium` whose back carries (E, H); kd = k0 · thickness. */
function acrossMedium(medium: Medium, kd: number, E: Complex, H: Complex): [Complex, Complex] {
  const delta = medium.q.mul(kd);
  const cos = delta.cos();
  const sin = delta.sin();
  const minusI = new Complex(0, -1);
  return [
    cos.mul(E).add(minusI.mul(sin).div(medium.eta).mul(H)),
    minusI.mul(medium.eta).mul(sin).mul(E).add(cos.mul(H)),
  ];
}

/**
 * `count` evenly spaced depths (nm) from −marginNm (in the incident medium) to the stack's total
 * thickness + marginNm (in the substrate), for {@link fieldProfile}.
 */
export function evenDepthsNm(stack: OpticalStack, count: number, marginNm = 0): Float64Array {
  if (!Number.isInteger(count) || count < 2)
    throw new OpticsInputError('count', 'must be a whole number ≥ 2');
  finiteNumber(marginNm, 'marginNm');
  const total = stackThicknessNm(stack);
  const out = new Float64Array(count);
  for (let i = 0; i < count; i++) out[i] = -marginNm + ((total + 2 * marginNm) * i) / (count - 1);
  return out;
}
