import type { FieldValues, Resolver } from 'react-hook-form';
import type { z } from 'zod';

/**
 * A react-hook-form resolver whose zod schema, and zod itself (about 25 KB
 * gzipped), load with the form's first check instead of with the page: give it
 * the schema's dynamic import, at module level so every render shares one load.
 * It checks exactly as `zodResolver(schema)` would.
 *
 *   const resolver = lazyResolver(() => import('@shared/schemas/auth').then((m) => m.signInSchema));
 *   useForm<SignInInput>({ resolver, … })
 *
 * Making one has no side effects (so a module that makes one can still be left
 * out of a chunk that does not use it); the schema loads at the first check,
 * and a failed load is tried again at the next.
 */
/*#__NO_SIDE_EFFECTS__*/
export function lazyResolver<T extends z.ZodType<unknown, FieldValues>>(
  loadSchema: () => Promise<T>,
): Resolver<z.input<T>, unknown, z.output<T>> {
  let loading: Promise<Resolver<z.input<T>, unknown, z.output<T>>> | undefined;
  const load = () =>
    (loading ??= Promise.all([import('@hookform/resolvers/zod'), loadSchema()])
      .then(([{ zodResolver }, schema]) => zodResolver(schema) as unknown as Resolver<z.input<T>, unknown, z.output<T>>)
      .catch((error: unknown) => {
        loading = undefined;
        throw error;
      }));
  return async (...args) => (await load())(...args);
}
