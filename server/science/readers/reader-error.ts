import { ScienceInputError } from '../types';

/**
 * The one error the light-curve readers throw. Its message says what is wrong with the file and,
 * where it helps, what was allowed; it is shown to the uploader as it is.
 */
export class ReaderError extends ScienceInputError {
  override name = 'ReaderError';
}
