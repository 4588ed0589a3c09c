// Writing a whole file so that a failed write never looks like a save and never costs the file
// that was there. Every file Tailwise writes (workbook, pack, report, SVG, PDF, PNG, CSV) goes
// through writeFileReplacing; the window and the command line reach it through a thin Qt adapter
// (ui/document/savefile.h).
//
// The steps, each checked (common practice for atomic replacement on POSIX file systems):
//   1. the target, when it exists, must be a regular file (never a device, FIFO, socket or
//      folder); a symbolic link is followed and the file it names is replaced;
//   2. the bytes go to a new temporary file in the target's folder (same file system), written in
//      chunks, every write() checked (short writes continued, EINTR retried);
//   3. fsync() and close() of the temporary file checked — a full disk or a quota often shows only
//      here;
//   4. only then rename() over the target (atomic), and the folder fsync'd;
//   5. on any failure the temporary file is removed and the old file is untouched.
// The error reads "could not save FILE: <the system's reason>", e.g. "No space left on device".
#pragma once

#include "tailwise/result.h"

#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

#include <sys/types.h>

namespace tailwise {

// Writes `bytes` to `path` as described above. A new file gets the usual permissions (0666 less
// the umask); a replaced file keeps its own.
Status writeFileReplacing(const std::string &path, std::string_view bytes);

// Writes `bytes` to standard output and flushes it; the error names the system's reason (a full
// disk behind a redirection, a closed pipe).
Status writeStandardOutput(std::string_view bytes);

// Refuses an output that is one of the command's inputs: the same file by canonical path or by
// device and inode (a hard link, another spelling). The message names both. Inputs that do not
// exist are ignored. "-" (standard output) is never an input. `option` names the output's option
// in the message ("--out", "--xlsx").
Status checkOutputIsNotAnInput(const std::string &output, const std::vector<std::string> &inputs,
                               const std::string &option = "--out");

// The index in `inputs` of the first file that `output` would overwrite (same canonical path, or
// same device and inode), or -1 when none: the test behind checkOutputIsNotAnInput, for callers
// that word the refusal themselves (the window).
long indexOfSameFile(const std::string &output, const std::vector<std::string> &inputs);

namespace testing {
// For tests only: replaces the write(2) used by writeFileReplacing (nullptr restores it), so that
// the n-th write or a short write can be made to fail. Also replaces fsync(2) when `fsyncFn` given.
using WriteFunction = ssize_t (*)(int fd, const void *data, std::size_t size);
using SyncFunction = int (*)(int fd);
void setFileWriteFunctions(WriteFunction writeFn, SyncFunction fsyncFn = nullptr);
} // namespace testing

} // namespace tailwise
