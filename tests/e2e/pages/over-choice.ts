import type { Locator } from '@playwright/test';

/** The keep-or-send-back choice a check-in line shows for a count over the supplier's tolerance. */
export class OverChoice {
  constructor(private readonly line: Locator) {}

  root(): Locator {
    return this.line.locator('[data-test="over-choice"]');
  }

  keep(): Locator {
    return this.root().getByRole('radio', { name: /Keep them/ });
  }

  sendBack(): Locator {
    return this.root().getByRole('radio', { name: /Send them back/ });
  }

  /** What keeping the extra would do, e.g. "3 pcs go to R…, line due Tue 22 Dec". */
  keepWords(): Locator {
    return this.root().locator('[data-test="keep-words"]');
  }

  returnWords(): Locator {
    return this.root().locator('[data-test="return-words"]');
  }

  problem(): Locator {
    return this.line.locator('[role="alert"]');
  }

  result(): Locator {
    return this.line.locator('[data-test="line-result"]');
  }
}
