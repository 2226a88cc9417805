import { type ArgumentsHost, Catch, type ExceptionFilter, Inject, PayloadTooLargeException } from '@nestjs/common';
import type { Response } from 'express';
import { toErrorBody } from '../common/all-exceptions.filter.js';
import { SYNC_CONFIG, type SyncConfig } from '../sync/sync-config.js';

/** Multer's "File too large" said with the limit and the setting that controls it. */
@Catch(PayloadTooLargeException)
export class UploadTooLargeFilter implements ExceptionFilter {
  constructor(@Inject(SYNC_CONFIG) private readonly config: SyncConfig) {}

  catch(_exception: PayloadTooLargeException, host: ArgumentsHost): void {
    const limit = this.config.uploads.maxBytes;
    const body = toErrorBody(
      new PayloadTooLargeException({ message: `The file is larger than ${limit} bytes, the upload limit (PW_UPLOAD_MAX_BYTES); nothing was stored`, details: { limit } }),
    );
    host.switchToHttp().getResponse<Response>().status(body.statusCode).json(body);
  }
}
