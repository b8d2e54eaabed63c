import type { FieldValues, Resolver } from 'react-hook-form';

/**
 * A form's resolver whose code (the zod schema, zod itself and the resolver adapter) loads on
 * demand instead of with the page: the form shows and takes typing at once, and the checks are
 * fetched while the person types (`preload`, called when the form mounts) or, at the latest, on
 * the first submit. The checks are the same schema as ever; only when its code arrives differs.
 */
export function lazyResolver<TInput extends FieldValues, TOutput>(
  load: () => Promise<Resolver<TInput, unknown, TOutput>>,
): { resolver: Resolver<TInput, unknown, TOutput>; preload: () => void } {
  let loading: Promise<Resolver<TInput, unknown, TOutput>> | undefined;
  const loaded = () =>
    (loading ??= load().catch((error: unknown) => {
      // A failed load (a dropped network) is tried again on the next submit, not kept.
      loading = undefined;
      throw error;
    }));
  return {
    resolver: async (values, context, options) => (await loaded())(values, context, options),
    preload: () => void loaded().catch(() => undefined),
  };
}
