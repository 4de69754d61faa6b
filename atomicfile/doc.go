// Package atomicfile writes files so that no reader ever sees one half
// written: the content goes to a temporary file beside the target, which is
// synced and renamed over it (and the directory synced), and on any error
// the temporary file is removed and the target left as it was. A target
// that exists and is not a regular file (a device such as /dev/null, a
// FIFO) is written directly, since renaming over it would replace it. New
// files get mode 0666 less the umask, as for any file a program creates,
// unless a mode is given.
//
// Errors are the operating system's (they name the file); callers prefix
// them with their own package.
package atomicfile
