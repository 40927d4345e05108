// Clean: the same work, awaited.
async function saveSomething(): Promise<void> {
  await Promise.resolve();
}

export async function handler(): Promise<void> {
  await saveSomething();
}
