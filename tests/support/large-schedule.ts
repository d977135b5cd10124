/**
 * A valid schedule at the service's vertex limit, as JSON text: 40 stations, each an elliptic orifice of 5,000
 * vertices (200,000 in all, about 3 MB), semi-axes 20–23.9 mm by 3 mm, coordinates to 3 decimals, stations 50 mm
 * apart; its boundaries (about 4.5 m in all) are well inside the plan size limit. Invented data for tests and
 * benchmarks of large requests.
 */
export function scheduleAtVertexLimit(): string {
  const stations = Array.from({ length: 40 }, (_, k) => {
    const a = 20 + 0.1 * k;
    const outer = Array.from({ length: 5000 }, (_, i) => {
      const t = (2 * Math.PI * i) / 5000;
      return [Number((a * Math.cos(t)).toFixed(3)), Number((3 * Math.sin(t)).toFixed(3))];
    });
    return { position_m: 0.05 * k, orifice: { outer } };
  });
  return JSON.stringify({ name: 'vertex-limit', material: 'PVC-U', stations });
}
