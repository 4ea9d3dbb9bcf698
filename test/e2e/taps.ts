// Counts what a person does in a browser test, for the tap-count goals of the visit and the events.
import type { Locator } from 'playwright-core';

/**
 * A tap on a button, link or radio is 1; choosing in a drop-down is 2 (open, choose); typing is 1 tap
 * into the field plus its digits, counted apart (words are not counted). `typing: 'keys'` types key by
 * key after a click (as a person does in a number field); 'fill' sets the value at once (date fields).
 */
export class Taps {
  taps = 0;
  digits = 0;
  constructor(private readonly typing: 'keys' | 'fill' = 'keys') {}
  async tap(target: Locator): Promise<void> {
    this.taps++;
    await target.click();
  }
  async choose(select: Locator, value: string): Promise<void> {
    this.taps += 2;
    await select.selectOption(value);
  }
  async type(field: Locator, text: string): Promise<void> {
    this.taps++;
    this.digits += text.replace(/[^0-9]/g, '').length;
    if (this.typing === 'fill') {
      await field.fill(text);
      return;
    }
    await field.click();
    await field.pressSequentially(text);
  }
}
