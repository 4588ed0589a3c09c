// A stub for write(2) shared by the tests of failed saves: lets `g_writeBudget` bytes through in
// all, then fails with ENOSPC (a full disk); a write that crosses the budget is cut short, as a real
// file system does. Installed with `testing::setFileWriteFunctions` (tailwise/filewrite.h).
#pragma once

#include <algorithm>
#include <cerrno>
#include <cstddef>

#include <sys/types.h>
#include <unistd.h>

namespace tailwise::test {

inline std::size_t g_writeBudget = 0;

inline ssize_t limitedWrite(int fd, const void *data, std::size_t size)
{
    if (g_writeBudget == 0) {
        errno = ENOSPC;
        return -1;
    }
    const std::size_t n = std::min(size, g_writeBudget);
    g_writeBudget -= n;
    return ::write(fd, data, n);
}

} // namespace tailwise::test
