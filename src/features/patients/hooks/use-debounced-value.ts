// One debounce for every search box: src/lib/use-debounced-value.ts.
export { useDebouncedValue } from '../../../lib/use-debounced-value';
