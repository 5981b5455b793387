import { z } from 'zod';

/** The `version` every editable representation carries; send it back in If-Match when changing it. */
export const versionField = {
  version: z.string().meta({
    description:
      'Version of this representation; send it in If-Match to change it, and get 409 `stale` if someone changed it first.',
  }),
};
