/**
 * Reading a picture file from disk for the command line: the checks of the file as a file
 * (exists, is a regular file, size), then the bytes to sniffPicture (pictureFile.ts).
 */
import { readFileSync, statSync } from 'node:fs';
import { InvalidInputError } from '../errors.js';
import { MAX_PICTURE_BYTES, sniffPicture, type PictureFile } from './pictureFile.js';

/** Read and recognise a picture file; refusals name `field` and quote the name as given. */
export function readPictureFile(fullPath: string, field: string, name: string): PictureFile {
  let size: number;
  try {
    const stat = statSync(fullPath);
    if (!stat.isFile()) throw new InvalidInputError(field, name, 'a JPEG or PNG picture file', 'This is not a regular file');
    size = stat.size;
  } catch (error) {
    if (error instanceof InvalidInputError) throw error;
    throw new InvalidInputError(field, name, 'a JPEG or PNG picture file', 'There is no file at this path (or it cannot be read)');
  }
  if (size > MAX_PICTURE_BYTES) {
    throw new InvalidInputError(field, name, `a picture of at most ${MAX_PICTURE_BYTES / (1024 * 1024)} MiB`, `It has ${size} bytes`);
  }
  return sniffPicture(new Uint8Array(readFileSync(fullPath)), field, name);
}
