/** Geometric properties of a circular hollow section, in the units of D and t. */
export type ChsProperties = {
  area: number;
  secondMoment: number;
  radiusOfGyration: number;
  elasticModulus: number;
  plasticModulus: number;
};

/** CHS properties from outside diameter D and wall thickness t (d = D − 2t), standard tube geometry. */
export function chsProperties(D: number, t: number): ChsProperties {
  if (!(D > 0) || !(t > 0) || 2 * t > D) throw new RangeError(`Invalid CHS ${D} x ${t}: need D > 2t > 0`);
  const d = D - 2 * t;
  const area = (Math.PI * (D * D - d * d)) / 4;
  const secondMoment = (Math.PI * (D ** 4 - d ** 4)) / 64;
  return {
    area,
    secondMoment,
    radiusOfGyration: Math.sqrt(D * D + d * d) / 4,
    elasticModulus: (2 * secondMoment) / D,
    plasticModulus: (D ** 3 - d ** 3) / 6,
  };
}
