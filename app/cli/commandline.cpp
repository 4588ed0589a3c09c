#include "commandline.h"

#include "optiontext.h"

#include <CLI/CLI.hpp>

#include <sstream>

namespace tailwise::cli {

namespace {

// The help's layout: our own opening and closing prose around CLI11's option sections, the
// placeholder after the name ("--confidence C"), nothing of CLI11's own usage line.
class HelpLayout : public CLI::Formatter {
public:
    HelpLayout() { column_width(23); }
    std::string make_usage(const CLI::App *, std::string) const override { return {}; }
    std::string make_positionals(const CLI::App *) const override { return {}; }
    std::string make_description(const CLI::App *app) const override { return app->get_description() + "\n\n"; }
    std::string make_group(std::string group, bool positional, std::vector<const CLI::Option *> opts) const override
    {
        std::string out = group + ":\n"; // the sections are one blank line apart
        for (const CLI::Option *opt : opts)
            out += make_option(opt, positional);
        return out;
    }
    std::string make_footer(const CLI::App *app) const override { return app->get_footer(); }
    std::string make_option_opts(const CLI::Option *opt) const override
    {
        return opt->get_type_size() == 0 ? std::string() : " " + opt->get_type_name();
    }
};

} // namespace

struct CommandLine::Declared {
    CLI::Option *option = nullptr;
    std::string name;
    std::string *text = nullptr;
    std::optional<std::string> *maybe = nullptr;
    std::vector<std::string> *all = nullptr;
    bool *flag = nullptr;
};

CommandLine::CommandLine(std::string command, std::string about, std::string closing)
    : m_app(std::make_unique<CLI::App>(std::move(about), "tailwise-cli " + command))
{
    m_app->formatter(std::make_shared<HelpLayout>());
    m_app->footer(std::move(closing));
    m_app->set_help_flag(); // ours is declared like any flag, so that it is listed in its section
    m_app->allow_extras(true); // refused below with the command line's own words
    m_app->option_defaults()->multi_option_policy(CLI::MultiOptionPolicy::TakeAll);
}

CommandLine::~CommandLine() = default;

void CommandLine::section(const std::string &title) { m_section = title; }

void CommandLine::value(const std::string &name, std::string &target, const std::string &typeName,
                        const std::string &help)
{
    Declared d;
    d.option = m_app->add_option(name)->description(help)->type_name(typeName)->group(m_section)->allow_extra_args(false);
    d.name = name.substr(0, name.find(','));
    d.text = &target;
    m_declared.push_back(d);
}

void CommandLine::value(const std::string &name, std::optional<std::string> &target, const std::string &typeName,
                        const std::string &help)
{
    Declared d;
    d.option = m_app->add_option(name)->description(help)->type_name(typeName)->group(m_section)->allow_extra_args(false);
    d.name = name.substr(0, name.find(','));
    d.maybe = &target;
    m_declared.push_back(d);
}

void CommandLine::repeatable(const std::string &name, std::vector<std::string> &targets, const std::string &typeName,
                             const std::string &help)
{
    Declared d;
    d.option = m_app->add_option(name)
                   ->description(help + "\n(repeatable: give it once for each)")
                   ->type_name(typeName)
                   ->group(m_section)
                   ->allow_extra_args(false);
    d.name = name.substr(0, name.find(','));
    d.all = &targets;
    m_declared.push_back(d);
}

void CommandLine::flag(const std::string &name, bool &target, const std::string &help)
{
    Declared d;
    d.option = m_app->add_flag(name)->description(help)->group(m_section);
    d.name = name.substr(0, name.find(','));
    d.flag = &target;
    m_declared.push_back(d);
}

void CommandLine::positional(const std::string &name, std::string &target)
{
    m_positionalName = name;
    m_positional = &target;
    m_app->add_option("positional-argument")->group("");
}

Status CommandLine::parse(const std::vector<std::string> &args)
{
    const std::string seeHelp = " (see " + m_app->get_name() + " --help)";
    // --help anywhere wins, as it always has: nothing else is checked.
    for (const std::string &a : args) {
        if (a == "--")
            break;
        if (a == "--help" || a == "-h") {
            m_help = true;
            return Done{};
        }
    }
    std::vector<std::string> reversed(args.rbegin(), args.rend()); // CLI11 takes them last first
    try {
        m_app->parse(reversed);
    } catch (const CLI::ArgumentMismatch &e) {
        const std::string what = e.what();
        const std::size_t colon = what.find(':');
        const std::string option = colon == std::string::npos ? std::string("option") : what.substr(0, colon);
        return usage(option, "expected a value after the option");
    } catch (const CLI::ParseError &e) {
        return usage(m_app->get_name(), e.what());
    }
    const std::vector<std::string> extra = m_app->remaining();
    if (!extra.empty()) {
        const std::string &first = extra.front();
        if (first.size() > 1 && first[0] == '-')
            return usage(first, "unknown option" + seeHelp);
        return usage(first, "unexpected argument: options start with '--'" + seeHelp);
    }
    if (m_positional) {
        const CLI::Option *p = m_app->get_option("positional-argument");
        const auto &given = p->results();
        if (given.size() > 1)
            return usage(given[1], "unexpected argument: give one " + m_positionalName + " (the first was \"" + given[0]
                                       + "\")" + seeHelp);
        if (!given.empty())
            *m_positional = given[0];
    }
    for (const Declared &d : m_declared) {
        const std::size_t count = d.option->count();
        if (count == 0)
            continue;
        if (count > 1 && !d.all) {
            std::string values;
            if (!d.flag) {
                const auto &given = d.option->results();
                values = " (\"" + given[0] + "\" and \"" + given[1] + "\")";
            }
            return usage(d.name, "given more than once" + values + ": give it once" + seeHelp);
        }
        if (d.flag)
            *d.flag = true;
        else if (d.text)
            *d.text = d.option->results().front();
        else if (d.maybe)
            *d.maybe = d.option->results().front();
        else
            *d.all = d.option->results();
    }
    return Done{};
}

std::string CommandLine::help() const { return m_app->help(); }

} // namespace tailwise::cli
