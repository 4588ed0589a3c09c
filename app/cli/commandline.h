// One command's options, declared once with their help text (CLI11, Debian's libcli11-dev), and
// the command line's rules for all commands:
//   - an option that is not repeatable given twice is refused, naming it and both values;
//   - an unknown option or a stray argument is refused, naming it;
//   - `--help` (or -h) wins over everything else and prints the help built from the declarations.
// Values are taken as text here and read by each option group (optiongroups.h), so that a bad
// value's message says what was expected in the command line's own words. Errors are usage errors
// (exit 2) naming the option: "--confidence: …".
#pragma once

#include "tailwise/result.h"

#include <memory>
#include <optional>
#include <string>
#include <vector>

namespace CLI {
class App;
class Option;
} // namespace CLI

namespace tailwise::cli {

class CommandLine {
public:
    // `command` as typed ("var"); `about` is the help's opening (what the command does and its
    // usage lines); `closing` follows the options (exit status, cautions).
    CommandLine(std::string command, std::string about, std::string closing);
    ~CommandLine();
    CommandLine(const CommandLine &) = delete;
    CommandLine &operator=(const CommandLine &) = delete;

    // The help section the next declarations go under ("Assumptions").
    void section(const std::string &title);
    // `--name VALUE`, at most once. `typeName` is the placeholder shown in the help ("C").
    void value(const std::string &name, std::string &target, const std::string &typeName, const std::string &help);
    // The same, but recording whether it was given at all (an empty value counts as given).
    void value(const std::string &name, std::optional<std::string> &target, const std::string &typeName,
               const std::string &help);
    // `--name VALUE`, repeatable by design: every value in the order given. The help says so.
    void repeatable(const std::string &name, std::vector<std::string> &targets, const std::string &typeName,
                    const std::string &help);
    // `--name`, at most once.
    void flag(const std::string &name, bool &target, const std::string &help);
    // A positional argument (WORKBOOK), at most one; described in `about`, not listed.
    void positional(const std::string &name, std::string &target);

    // Parses the arguments after the command. On success `helpWanted()` says whether to print
    // help() and stop. The error names the option (a usage error, exit 2).
    Status parse(const std::vector<std::string> &args);
    bool helpWanted() const { return m_help; }
    std::string help() const;

private:
    struct Declared;
    std::unique_ptr<CLI::App> m_app;
    std::vector<Declared> m_declared;
    std::string m_section;
    std::string m_positionalName;
    std::string *m_positional = nullptr;
    bool m_help = false;
};

} // namespace tailwise::cli
