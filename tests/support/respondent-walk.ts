// Moving a browser respondent through the phone flow's screens between trials (the task's
// instructions, the shelf of spot the saving, practice feedback), for tests that are about the
// answers rather than those screens. The flow's own e2e test (respondent-phone-flow.test.ts)
// checks each of those screens; here they are only passed.
import type { Page } from 'playwright-core';

/** Clicks on until a trial or the end screen is shown; returns which, and the trial's kind. */
export async function toNextTrial(page: Page, timeout = 20_000): Promise<{ at: 'trial' | 'end'; kind: string | null }> {
  const trial = page.getByTestId('trial');
  const end = page.getByTestId('thanks').or(page.getByTestId('preview-end'));
  const instructions = page.getByTestId('instructions');
  const feedback = page.getByTestId('practice-feedback');
  const shelf = page.getByTestId('shelf');
  for (;;) {
    await trial.or(end).or(instructions).or(feedback).or(shelf).first().waitFor({ timeout });
    if (await end.count()) return { at: 'end', kind: null };
    if (await trial.count()) return { at: 'trial', kind: await trial.getAttribute('data-kind') };
    const screen = (await instructions.count()) ? instructions : (await feedback.count()) ? feedback : shelf;
    await screen.getByRole('button').last().click({ timeout });
    await screen.waitFor({ state: 'detached', timeout }).catch(() => { /* the same kind of screen again (a second feedback) */ });
  }
}

/**
 * Answers the next trial the way most tests need: "Left" (pick), the first answer (spot, trip),
 * "Often" for the attention check. Returns 'end' once the flow has finished instead.
 */
export async function answerNext(page: Page, timeout = 20_000): Promise<'answered' | 'end'> {
  const next = await toNextTrial(page, timeout);
  if (next.at === 'end') return 'end';
  const trial = page.getByTestId('trial');
  const button = next.kind === 'attention' ? page.getByRole('button', { name: 'Often' })
    : (await trial.locator('[data-phase]').count()) ? page.getByRole('button', { name: 'Left', exact: true })
      : trial.getByRole('button').first();
  await button.click({ timeout });
  return 'answered';
}
