/** A failed file operation in words a person acts on, or null when its code has no plainer name. */
export function plainIoError(error: unknown): string | null {
  switch ((error as NodeJS.ErrnoException).code) {
    case 'ENOSPC':
      return 'the disk is full';
    case 'EDQUOT':
      return 'the disk quota is used up';
    case 'EACCES':
    case 'EPERM':
      return 'no permission to write in its folder';
    case 'EROFS':
      return 'the folder is read-only';
    default:
      return null;
  }
}
