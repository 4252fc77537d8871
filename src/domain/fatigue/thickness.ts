// IIW Recommendations 2016 §3.5.2 (recalled): f(t) = (25/t_eff)^n for t_eff > 25 mm, else 1; t_eff = 0.5·L when L/t ≤ 2.
export function thicknessFactor(t: number, n: number, toeToToe?: number): number {
  const tEff = toeToToe !== undefined && toeToToe / t <= 2 ? 0.5 * toeToToe : t;
  return tEff > 25 ? (25 / tEff) ** n : 1;
}
