// Package atomicfile writes a file whole or not at all: the bytes go to a
// temporary file in the same folder, which is synced and then renamed over
// the target. A reader (an open workbook, an editor watching a sheet, a
// crash halfway) never sees half a file, and a failed write leaves the old
// file as it was. Every command that writes a user's file (fmt, new, batch
// --out, export) goes through it. A symbolic link is kept (the file it
// leads to is replaced), and Abort, called on SIGINT or SIGTERM, removes
// every temporary file still being written.
//
// The temporary file sits beside the target, not in the system's temporary
// folder, because a rename is atomic only within one file system.
package atomicfile
