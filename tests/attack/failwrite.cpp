/* A stand-in for a full disk, preloaded into tailwise-cli by attack.py (LD_PRELOAD):
 *   TAILWISE_FAIL_WRITE_AFTER=N  writes to regular files succeed for N bytes in all, then fail
 *                                with ENOSPC (a write crossing N is cut short, as on a full disk);
 *   TAILWISE_FAIL_FSYNC=1        fsync fails with ENOSPC (where a quota or a full disk often shows).
 * Standard streams and anything that is not a regular file are left alone. */
#include <dlfcn.h>
#include <cstdlib>
#include <errno.h>
#include <sys/stat.h>
#include <sys/types.h>
#include <unistd.h>

namespace {
long long budget = -1;

static int limited(int fd)
{
    struct stat st;
    if (fd <= 2 || fstat(fd, &st) != 0 || !S_ISREG(st.st_mode))
        return 0;
    if (budget < 0) {
        const char *text = std::getenv("TAILWISE_FAIL_WRITE_AFTER");
        if (!text)
            return 0;
        budget = std::atoll(text);
    }
    return 1;
}
} // namespace

extern "C" {

ssize_t write(int fd, const void *data, size_t size)
{
    static ssize_t (*real)(int, const void *, size_t) = nullptr;
    if (!real)
        real = reinterpret_cast<ssize_t (*)(int, const void *, size_t)>(dlsym(RTLD_NEXT, "write"));
    if (!limited(fd))
        return real(fd, data, size);
    if (budget == 0) {
        errno = ENOSPC;
        return -1;
    }
    if (static_cast<long long>(size) > budget)
        size = static_cast<size_t>(budget);
    const ssize_t n = real(fd, data, size);
    if (n > 0)
        budget -= n;
    return n;
}

int fsync(int fd)
{
    static int (*real)(int) = nullptr;
    if (!real)
        real = reinterpret_cast<int (*)(int)>(dlsym(RTLD_NEXT, "fsync"));
    const char *fail = std::getenv("TAILWISE_FAIL_FSYNC");
    if (fail && fail[0] == '1') {
        errno = ENOSPC;
        return -1;
    }
    return real(fd);
}
} // extern "C"
