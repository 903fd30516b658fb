import { DomainError } from '@/lib/errors';

/** The file is over the size cap (declared at the start, or found at the end). */
export class UploadTooLarge extends DomainError {
  readonly status = 413;
}

/** The stored bytes are not an acceptable image: wrong type by content, or damaged. */
export class UploadRejected extends DomainError {
  readonly status = 422;
}
