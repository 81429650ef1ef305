import type { RatingPolicy } from '../policy/rating-policy';
import { gammaLLForAdtt } from '../policy/rating-policy';
import type { VehicleCategory } from '../live-load/vehicle-schema';

/** Rating-factor keys of calc-file.md; stable, scripts read them. */
export type RatingFactorKey =
  | 'strength-inventory'
  | 'strength-operating'
  | 'strength-legal'
  | 'strength-permit'
  | 'service-iii-inventory'
  | 'service-iii-legal';

export interface StrengthDemand {
  /** C = φc φs φ Rn, N·mm. */
  readonly capacityNmm: number;
  readonly dcNmm: number;
  readonly dwNmm: number;
  /** Live load with impact, per girder, N·mm. */
  readonly liveNmm: number;
}

/**
 * LRFR strength I rating factor, AASHTO MBE 6A.4.2.1 [R]:
 * RF = (C − γDC DC − γDW DW) / (γLL (LL + IM)), with no secondary prestress effects on a simple span.
 */
export function strengthRatingFactor(demand: StrengthDemand, gammas: { gammaDC: number; gammaDW: number; gammaLL: number }): number {
  return (demand.capacityNmm - gammas.gammaDC * demand.dcNmm - gammas.gammaDW * demand.dwNmm) / (gammas.gammaLL * demand.liveNmm);
}

export interface ServiceStresses {
  /** Bottom-fibre stresses, tension positive, MPa. */
  readonly allowableTensionMpa: number;
  readonly deadAndPrestressMpa: number;
  readonly liveMpa: number;
}

/** LRFR Service III at the bottom fibre, MBE 6A.5.4.1 [R]: RF = (fR − fD − fP)/(γLL fLL); no φc, φs. */
export function serviceRatingFactor(stresses: ServiceStresses, gammaLL: number): number {
  return (stresses.allowableTensionMpa - stresses.deadAndPrestressMpa) / (gammaLL * stresses.liveMpa);
}

/** The strength rating levels a vehicle of a category is rated at, with their live-load factors. */
export function strengthLevels(category: VehicleCategory, policy: RatingPolicy, adtt: number): { key: RatingFactorKey; gammaLL: number }[] {
  const live = policy.liveLoad;
  switch (category) {
    case 'design':
      return [
        { key: 'strength-inventory', gammaLL: live.gammaLLInventory },
        { key: 'strength-operating', gammaLL: live.gammaLLOperating },
      ];
    case 'legal':
    case 'notional':
      return [{ key: 'strength-legal', gammaLL: gammaLLForAdtt(live.legalByAdtt, adtt) }];
    case 'emergency':
      return [{ key: 'strength-legal', gammaLL: live.emergencyGammaLL }];
    case 'permit':
      return [{ key: 'strength-permit', gammaLL: gammaLLForAdtt(live.permitByAdtt, adtt) }];
  }
}

/** The Service III levels of a category: design inventory always, legal loads when the policy rates them. */
export function serviceLevels(category: VehicleCategory, policy: RatingPolicy): { key: RatingFactorKey; gammaLL: number }[] {
  if (category === 'design') return [{ key: 'service-iii-inventory', gammaLL: policy.serviceIII.gammaLLInventory }];
  if ((category === 'legal' || category === 'notional') && policy.serviceIII.rateLegal) {
    return [{ key: 'service-iii-legal', gammaLL: policy.serviceIII.gammaLLLegal }];
  }
  return [];
}

/** The rating level a key belongs to, for the summary. */
export function levelOf(key: RatingFactorKey): 'inventory' | 'operating' | 'legal' | 'permit' {
  if (key.endsWith('inventory')) return 'inventory';
  if (key.endsWith('operating')) return 'operating';
  if (key.endsWith('permit')) return 'permit';
  return 'legal';
}

const KN_PER_TONNE = 9.80665;
const KN_PER_US_TON = 8.896443230521;

/**
 * Safe posting load, AASHTO MBE 6A.8.3 [R]: (W/0.7)(RF − 0.3) for 0.3 ≤ RF < 1.0, in tonnes or
 * US tons per the policy; below 0.3 the vehicle is not allowed (posting 0 with a note).
 */
export function postingLoad(ratingFactor: number, vehicleWeightKn: number, policy: RatingPolicy): { postingLoad: number; unit: 't' | 'ton'; note?: string } {
  const unit = policy.posting.unit;
  const weight = vehicleWeightKn / (unit === 't' ? KN_PER_TONNE : KN_PER_US_TON);
  if (ratingFactor < policy.posting.ratingFactorLimit) {
    return { postingLoad: 0, unit, note: `RF below ${policy.posting.ratingFactorLimit}: the vehicle should not be allowed on the span` };
  }
  return { postingLoad: (weight / 0.7) * (ratingFactor - policy.posting.ratingFactorLimit), unit };
}
