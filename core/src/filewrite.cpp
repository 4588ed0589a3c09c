#include "tailwise/filewrite.h"

#include <cerrno>
#include <cstdio>
#include <cstdlib>
#include <cstring>

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

namespace tailwise {

namespace {

testing::WriteFunction g_write = nullptr;
testing::SyncFunction g_fsync = nullptr;

ssize_t doWrite(int fd, const void *data, std::size_t size)
{
    return g_write ? g_write(fd, data, size) : ::write(fd, data, size);
}

int doFsync(int fd) { return g_fsync ? g_fsync(fd) : ::fsync(fd); }

Error saveError(const std::string &path, const std::string &why)
{
    return fileError(ErrorKind::FileUnreadable, path, 0, 0, "could not save " + path + ": " + why);
}

std::string systemReason(int error) { return std::strerror(error); }

std::string folderOf(const std::string &path)
{
    const std::size_t slash = path.rfind('/');
    if (slash == std::string::npos)
        return ".";
    if (slash == 0)
        return "/";
    return path.substr(0, slash);
}

std::string baseName(const std::string &path)
{
    const std::size_t slash = path.rfind('/');
    return slash == std::string::npos ? path : path.substr(slash + 1);
}

const char *kindOf(mode_t mode)
{
    if (S_ISDIR(mode))
        return "a folder";
    if (S_ISCHR(mode) || S_ISBLK(mode))
        return "a device";
    if (S_ISFIFO(mode))
        return "a pipe (FIFO)";
    if (S_ISSOCK(mode))
        return "a socket";
    return "not a regular file";
}

// Writes all of `bytes` to `fd` in chunks; false with errno set on failure.
bool writeAll(int fd, std::string_view bytes)
{
    constexpr std::size_t chunk = 1 << 16;
    std::size_t done = 0;
    while (done < bytes.size()) {
        const std::size_t want = std::min(chunk, bytes.size() - done);
        const ssize_t n = doWrite(fd, bytes.data() + done, want);
        if (n < 0) {
            if (errno == EINTR)
                continue;
            return false;
        }
        if (n == 0) { // no progress and no reason: treat as a full device
            errno = ENOSPC;
            return false;
        }
        done += static_cast<std::size_t>(n);
    }
    return true;
}

bool sameFile(const struct stat &a, const struct stat &b) { return a.st_dev == b.st_dev && a.st_ino == b.st_ino; }

} // namespace

Status writeFileReplacing(const std::string &givenPath, std::string_view bytes)
{
    if (givenPath.empty())
        return saveError(givenPath, "no file name given");
    std::string path = givenPath;
    struct stat existing {};
    bool exists = false;
    if (::stat(path.c_str(), &existing) == 0) {
        exists = true;
        if (!S_ISREG(existing.st_mode))
            return saveError(givenPath, std::string("it is ") + kindOf(existing.st_mode)
                                            + ", not a regular file; only a regular file is replaced");
        // A symbolic link: replace the file it names, keep the link.
        if (char *resolved = ::realpath(path.c_str(), nullptr)) {
            path = resolved;
            std::free(resolved);
        }
    } else if (errno != ENOENT) {
        return saveError(givenPath, systemReason(errno));
    }
    const std::string folder = folderOf(path);
    struct stat folderInfo {};
    if (::stat(folder.c_str(), &folderInfo) != 0)
        return saveError(givenPath, "the folder " + folder + " cannot be used: " + systemReason(errno));
    if (!S_ISDIR(folderInfo.st_mode))
        return saveError(givenPath, folder + " is not a folder");

    std::string temp = folder + "/." + baseName(path) + ".saving-XXXXXX";
    const int fd = ::mkstemp(temp.data());
    if (fd < 0)
        return saveError(givenPath, systemReason(errno));
    auto failWith = [&](int error) {
        ::unlink(temp.c_str());
        return saveError(givenPath, systemReason(error));
    };
    mode_t mode = 0;
    if (exists) {
        mode = existing.st_mode & 07777;
    } else {
        const mode_t mask = ::umask(0);
        ::umask(mask);
        mode = 0666 & ~mask;
    }
    if (::fchmod(fd, mode) != 0) {
        const int error = errno;
        ::close(fd);
        return failWith(error);
    }
    if (!writeAll(fd, bytes)) {
        const int error = errno;
        ::close(fd);
        return failWith(error);
    }
    if (doFsync(fd) != 0) {
        const int error = errno;
        ::close(fd);
        return failWith(error);
    }
    if (::close(fd) != 0)
        return failWith(errno);
    // The written size, checked once more: what is on disk is what was asked for.
    struct stat written {};
    if (::stat(temp.c_str(), &written) != 0)
        return failWith(errno);
    if (static_cast<std::size_t>(written.st_size) != bytes.size())
        return failWith(EIO);
    if (::rename(temp.c_str(), path.c_str()) != 0)
        return failWith(errno);
    // The rename is on disk once the folder is: best effort (some file systems refuse it).
    const int dirFd = ::open(folder.c_str(), O_RDONLY | O_DIRECTORY);
    if (dirFd >= 0) {
        ::fsync(dirFd);
        ::close(dirFd);
    }
    return Done{};
}

Status writeStandardOutput(std::string_view bytes)
{
    errno = 0;
    const std::size_t n = std::fwrite(bytes.data(), 1, bytes.size(), stdout);
    int error = errno;
    if (n == bytes.size() && std::fflush(stdout) == 0 && !std::ferror(stdout))
        return Done{};
    if (error == 0)
        error = errno;
    return fileError(ErrorKind::FileUnreadable, "standard output", 0, 0,
                     "could not write the output: " + (error != 0 ? systemReason(error) : std::string("write failed")));
}

long indexOfSameFile(const std::string &output, const std::vector<std::string> &inputs)
{
    if (output == "-")
        return -1;
    struct stat out {};
    if (::stat(output.c_str(), &out) != 0)
        return -1; // a new file cannot be an input
    char *outCanonical = ::realpath(output.c_str(), nullptr);
    const std::string outPath = outCanonical ? outCanonical : output;
    std::free(outCanonical);
    for (std::size_t i = 0; i < inputs.size(); ++i) {
        const std::string &input = inputs[i];
        struct stat in {};
        if (input.empty() || ::stat(input.c_str(), &in) != 0)
            continue;
        char *inCanonical = ::realpath(input.c_str(), nullptr);
        const std::string inPath = inCanonical ? inCanonical : input;
        std::free(inCanonical);
        if (sameFile(out, in) || inPath == outPath)
            return static_cast<long>(i);
    }
    return -1;
}

Status checkOutputIsNotAnInput(const std::string &output, const std::vector<std::string> &inputs,
                               const std::string &option)
{
    const long i = indexOfSameFile(output, inputs);
    if (i < 0)
        return Done{};
    return fieldError(ErrorKind::Assumption, option,
                      option + ": " + output + " is the input " + inputs[static_cast<std::size_t>(i)]
                          + " (the same file): writing there would destroy it; choose another file");
}

namespace testing {
void setFileWriteFunctions(WriteFunction writeFn, SyncFunction fsyncFn)
{
    g_write = writeFn;
    g_fsync = fsyncFn;
}
} // namespace testing

} // namespace tailwise
