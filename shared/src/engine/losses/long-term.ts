/**
 * Approximate long-term prestress loss of a pretensioned member, AASHTO LRFD 5.9.3.3 [R]
 * (article 5.9.5.3 in editions before the 2017 renumbering), in its SI form:
 *
 *   ΔfpLT = 10.0 (fpi Aps/Ag) γh γst + 83 γh γst + ΔfpR   (MPa)
 *   γh = 1.7 − 0.01 H,  γst = 35/(7 + f'ci)  (H in %, f'ci in MPa)
 *   ΔfpR = 17 MPa for low-relaxation strand, 69 MPa for stress-relieved strand.
 *
 * The US form is ΔfpLT = 10.0 (fpi Aps/Ag) γh γst + 12.0 γh γst + ΔfpR in ksi, with
 * γst = 5/(1 + f'ci) on f'ci in ksi and ΔfpR = 2.4 / 10.0 ksi. The engine uses the SI
 * constants, as engineering.md §1 asks wherever a code gives both forms. They are rounded
 * conversions, so the SI form gives between 0 and 2.74 % more than the US form converted
 * exactly. The low-relaxation ΔfpR accounts for most of that gap: 2.4 ksi is 16.55 MPa,
 * rounded to 17. All constants are recalled from the article; confirm them against the
 * edition the owner adopts.
 * The article's commentary reads the three terms as creep, shrinkage and relaxation.
 */

/** The strand types the approximate method distinguishes. */
export const STRAND_TYPES = ['low-relaxation', 'stress-relieved'] as const;
export type StrandType = (typeof STRAND_TYPES)[number];

/** ΔfpR of AASHTO LRFD 5.9.3.3, SI form [R]: 17 MPa (2.4 ksi) low-relaxation, 69 MPa (10.0 ksi) stress-relieved. */
export const RELAXATION_LOSS_MPA: Readonly<Record<StrandType, number>> = Object.freeze({
  'low-relaxation': 17,
  'stress-relieved': 69,
});

/** The SI form's multiplier of γh γst in the second term [R]: 12.0 ksi rounded to 83 MPa. */
export const LONG_TERM_CONSTANT_TERM_MPA = 83;

export interface LongTermLossOptions {
  /** fpi Aps/Ag: the force in the strand just before transfer over the gross area. */
  readonly fpiApsOverAgMpa: number;
  readonly relativeHumidityPct: number;
  readonly fciMpa: number;
  readonly strandType: StrandType;
}

/** ΔfpLT with its three terms and the two factors, as a checker signs them. */
export interface LongTermLoss {
  /** γh = 1.7 − 0.01 H. */
  readonly humidityFactor: number;
  /** γst = 35/(7 + f'ci), f'ci in MPa. */
  readonly strengthFactor: number;
  /** 10.0 (fpi Aps/Ag) γh γst. */
  readonly prestressTermMpa: number;
  /** 83 γh γst. */
  readonly constantTermMpa: number;
  /** ΔfpR. */
  readonly relaxationMpa: number;
  readonly totalMpa: number;
}

/** γh of AASHTO LRFD 5.9.3.3 [R]: 1.7 − 0.01 H, H the average annual ambient relative humidity in %. */
export function humidityFactor(relativeHumidityPct: number): number {
  return 1.7 - 0.01 * relativeHumidityPct;
}

/** γst of AASHTO LRFD 5.9.3.3, SI form [R]: 35/(7 + f'ci), f'ci the cylinder strength at transfer in MPa. */
export function strengthFactor(fciMpa: number): number {
  return 35 / (7 + fciMpa);
}

/** ΔfpLT by AASHTO LRFD 5.9.3.3, SI form [R] (see the module comment for the US form and the gap between them). */
export function approximateLongTermLoss(options: LongTermLossOptions): LongTermLoss {
  const gammaH = humidityFactor(options.relativeHumidityPct);
  const gammaSt = strengthFactor(options.fciMpa);
  const prestressTermMpa = 10.0 * options.fpiApsOverAgMpa * gammaH * gammaSt;
  const constantTermMpa = LONG_TERM_CONSTANT_TERM_MPA * gammaH * gammaSt;
  const relaxationMpa = RELAXATION_LOSS_MPA[options.strandType];
  return {
    humidityFactor: gammaH,
    strengthFactor: gammaSt,
    prestressTermMpa,
    constantTermMpa,
    relaxationMpa,
    totalMpa: prestressTermMpa + constantTermMpa + relaxationMpa,
  };
}
