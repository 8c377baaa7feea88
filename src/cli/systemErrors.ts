/**
 * System errors (Node's `code` on an Error: POSIX errno names, POSIX.1-2017 <errno.h>) in
 * plain words, for one-line messages. Only the front ends meet them; the core never does.
 */

/** True when `error` is a system error, optionally of the given code. */
export function isSystemError(error: unknown, code?: string): error is NodeJS.ErrnoException {
  if (!(error instanceof Error) || typeof (error as NodeJS.ErrnoException).code !== 'string') return false;
  return code === undefined || (error as NodeJS.ErrnoException).code === code;
}

const WORDS: Readonly<Record<string, string>> = {
  ENOSPC: 'the disk is full (no space left on the device)',
  EDQUOT: 'your disk quota is used up',
  EACCES: 'permission denied (you may not write there)',
  EPERM: 'the operation is not permitted there',
  EROFS: 'the folder is on a read-only file system',
  EISDIR: 'it is a folder, not a file',
  ENOTDIR: 'a part of the path is a file, not a folder',
  ENAMETOOLONG: 'the name is too long for the file system (at most 255 bytes per name)',
  EEXIST: 'a file of that name exists already',
  ENOENT: 'a folder on the path does not exist',
  ELOOP: 'the path has too many symbolic links (a loop?)',
  EIO: 'the device reported an input/output error',
  EFBIG: 'the file would be larger than the file system allows',
  ETXTBSY: 'the file is a program being run',
  EBUSY: 'the file or device is busy',
  EMFILE: 'too many files are open',
  ENFILE: 'too many files are open on the system',
};

/** System error codes that are a problem of the user's files or machine, not a defect of heliochron. */
export const PLAIN_SYSTEM_ERRORS: ReadonlySet<string> = new Set(Object.keys(WORDS));

/**
 * A system error in plain words, its code in brackets.
 * @example systemErrorWords(Object.assign(new Error(), { code: 'ENOSPC' })) // 'the disk is full (no space left on the device) [ENOSPC]'
 */
export function systemErrorWords(error: unknown): string {
  if (isSystemError(error)) {
    const code = error.code as string;
    return `${WORDS[code] ?? error.message} [${code}]`;
  }
  return error instanceof Error ? error.message : String(error);
}
