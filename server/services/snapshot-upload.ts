/** An uploaded snapshot checked (type, FLS1 structure) and compressed for storage, before any write. */
import { promisify } from 'node:util';
import { gzip as gzipCb } from 'node:zlib';
import { UnsupportedMediaTypeError, ValidationError } from '../errors';
import { SNAPSHOT_CONTENT_TYPE } from '../../workers/io/snapshot-format';
import { decodeSnapshot } from '../../workers/io/snapshot-codec';

const gzip = promisify(gzipCb);

export interface UploadedSnapshot {
  buffer: Buffer;
  mimetype: string;
}

export interface CheckedSnapshot {
  gzip: Buffer;
  rawSize: number;
  width: number;
  height: number;
}

/** The media type without parameters, lower-cased. */
const bareType = (contentType: string | undefined) => (contentType ?? '').split(';')[0].trim().toLowerCase();

export async function checkSnapshot(file: UploadedSnapshot | undefined): Promise<CheckedSnapshot> {
  if (!file) throw new ValidationError({ snapshot: 'Attach the snapshot file in the form field "snapshot".' }, 'No snapshot file was sent.');
  if (bareType(file.mimetype) !== SNAPSHOT_CONTENT_TYPE) {
    throw new UnsupportedMediaTypeError(`A snapshot is sent as ${SNAPSHOT_CONTENT_TYPE}, not ${file.mimetype || 'an untyped file'}.`);
  }
  const decoded = decodeSnapshot(file.buffer);
  if (!decoded.ok) throw new ValidationError(decoded.fields, decoded.message);
  return { gzip: await gzip(file.buffer), rawSize: file.buffer.length, width: decoded.header.width, height: decoded.header.height };
}
