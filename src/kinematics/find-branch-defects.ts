/**
 * Branch defects along a sequence of configurations (path samples or solved stations in schedule order): the indices
 * i ≥ 1 where the sign of the driven-Jacobian determinant differs from the last nonzero sign before it, i.e. where
 * getting from configuration i − 1 to i means passing through a singular configuration (Chase & Mirth, J. Mech. Des.
 * 115(2) 1993; the determinant test in Haug). Zero signs (singular configurations) are skipped. Empty: no defect.
 */
export function findBranchDefects(configurations: readonly { readonly jacobianSign: number }[]): number[] {
  const defects: number[] = [];
  let previous = 0;
  configurations.forEach((c, i) => {
    const sign = Math.sign(c.jacobianSign);
    if (sign === 0) return;
    if (previous !== 0 && sign !== previous) defects.push(i);
    previous = sign;
  });
  return defects;
}
