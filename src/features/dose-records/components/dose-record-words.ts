export const eyeWords = { right: 'Right eye', left: 'Left eye' } as const;
export const outcomeWords = { completed: 'Completed', stopped: 'Stopped early' } as const;
export const kindWords = { pdt: 'PDT', cxl: 'CXL' } as const;
export { severityWords, typeWords } from '../../../lib/deviation-words';
