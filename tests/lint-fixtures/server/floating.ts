// Bad: a promise nobody awaits or handles (its rejection would be lost).
async function saveSomething(): Promise<void> {
  await Promise.resolve();
}

export function handler(): void {
  saveSomething();
}
