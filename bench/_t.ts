export function time(label: string, fn: () => void, perRound = 5) {
  for (let i = 0; i < 3000; i++) fn();
  const samples: number[] = [];
  for (let r = 0; r < 400; r++) { const t0 = performance.now(); for (let i = 0; i < perRound; i++) fn(); samples.push((performance.now() - t0) * 1000 / perRound); }
  samples.sort((a, b) => a - b);
  console.log(label.padEnd(40), 'min', samples[0]!.toFixed(2), 'p10', samples[40]!.toFixed(2), 'us');
}
