// --deviation swing.csv for `report`: the fitted card as a function δ(compass heading), easterly +.
// The swing code pulls in mathjs (about a second to load), so it is loaded only when a card is given.
export async function readDeviationFile(file: string): Promise<(compassDeg: number) => number> {
  const { readSwingFile } = await import('./swingFile.js');
  const { deviationAtDeg } = await import('../src/deviation/smithCoefficients.js');
  const r = await readSwingFile(file);
  const coeffs = { aDeg: r.A_deg, bDeg: r.B_deg, cDeg: r.C_deg, dDeg: r.D_deg, eDeg: r.E_deg };
  return (compassDeg: number) => deviationAtDeg(coeffs, compassDeg);
}
