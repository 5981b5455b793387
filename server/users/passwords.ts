import argon2 from 'argon2';

/**
 * argon2id with the library's defaults (RFC 9106 second recommended option, 64 MiB). Tests may
 * lower the memory cost through ARGON2_MEMORY_KIB to run fast; the parameters travel inside each
 * hash, so a hash made either way verifies either way.
 */
export function hashPassword(password: string): Promise<string> {
  const memoryCost = Number(process.env.ARGON2_MEMORY_KIB);
  return argon2.hash(password, {
    type: argon2.argon2id,
    ...(Number.isInteger(memoryCost) && memoryCost >= 1024 && { memoryCost }),
  });
}

export async function verifyPassword(hash: string, password: string): Promise<boolean> {
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
}
