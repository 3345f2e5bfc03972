/** Waits for a condition that background work should bring about: a hang guard, not a speed limit. */
export async function eventually(check: () => Promise<boolean>, what: string): Promise<void> {
  for (let i = 0; i < 600; i += 1) {
    if (await check()) return;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error(`never happened: ${what}`);
}
