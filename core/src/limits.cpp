#include "tailwise/limits.h"

#include "tailwise/json.h"

#include <charconv>
#include <cmath>

namespace tailwise {

namespace {

std::optional<double> parseNumber(std::string_view text)
{
    if (text.empty())
        return std::nullopt;
    double v = 0.0;
    const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), v);
    if (ec != std::errc() || end != text.data() + text.size() || !std::isfinite(v))
        return std::nullopt;
    return v;
}

std::string quoted(std::string_view s)
{
    std::string out;
    out.reserve(s.size() + 2);
    out.push_back('"');
    out.append(s);
    out.push_back('"');
    return out;
}

std::string_view trim(std::string_view s)
{
    while (!s.empty() && s.front() == ' ')
        s.remove_prefix(1);
    while (!s.empty() && s.back() == ' ')
        s.remove_suffix(1);
    return s;
}

} // namespace

std::string_view toName(LimitMeasure m) { return m == LimitMeasure::Var ? "var" : "es"; }

std::string_view toName(LimitState s)
{
    switch (s) {
    case LimitState::Ok: return "ok";
    case LimitState::Warning: return "warning";
    case LimitState::Breached: return "breached";
    }
    return "ok";
}

std::optional<LimitMeasure> parseLimitMeasure(std::string_view name)
{
    if (name == "var")
        return LimitMeasure::Var;
    if (name == "es")
        return LimitMeasure::Es;
    return std::nullopt;
}

std::optional<LimitState> parseLimitState(std::string_view name)
{
    for (const auto s : {LimitState::Ok, LimitState::Warning, LimitState::Breached})
        if (toName(s) == name)
            return s;
    return std::nullopt;
}

Result<Limit> parseLimit(std::string_view text, const std::string &option)
{
    const std::string shown = quoted(text);
    auto bad = [&](const std::string &what) {
        return fieldError(ErrorKind::Value, option, what + " in " + shown
                                                        + " (expected MEASURE=AMOUNT[%][,warn=W%][,group=NAME], e.g. var=250000 or es=2.5%,warn=90%)");
    };
    Limit limit;
    bool first = true;
    while (true) {
        const std::size_t comma = text.find(',');
        const std::string_view part = trim(text.substr(0, comma));
        const std::size_t eq = part.find('=');
        if (eq == std::string_view::npos)
            return bad(quoted(part) + " has no \"=\"");
        const std::string_view name = trim(part.substr(0, eq));
        std::string_view val = trim(part.substr(eq + 1));
        if (first) {
            const auto measure = parseLimitMeasure(name);
            if (!measure)
                return bad("the measure \"" + std::string(name) + "\" is neither var nor es");
            limit.measure = *measure;
            if (!val.empty() && val.back() == '%') {
                limit.percentOfValue = true;
                val.remove_suffix(1);
            }
            const auto amount = parseNumber(trim(val));
            if (!amount)
                return bad("the amount \"" + std::string(val) + "\" is not a number");
            if (*amount <= 0.0)
                return bad("the limit must be greater than zero, found " + std::string(val));
            if (limit.percentOfValue && *amount > 100.0)
                return bad("a limit in percent of value is at most 100%, found " + std::string(val) + "%");
            limit.amount = *amount;
        } else if (name == "warn") {
            if (val.empty() || val.back() != '%')
                return bad("the warning level is a percentage of the limit such as warn=80%");
            val.remove_suffix(1);
            const auto w = parseNumber(trim(val));
            if (!w || *w <= 0.0 || *w > 100.0)
                return bad("the warning level must be above 0% and at most 100%, found \"" + std::string(val) + "%\"");
            limit.warningLevel = *w / 100.0;
        } else if (name == "group") {
            if (val.empty())
                return bad("group= needs a group name");
            limit.group = std::string(val);
        } else {
            return bad("unknown part \"" + std::string(name) + "\" (expected warn or group)");
        }
        first = false;
        if (comma == std::string_view::npos)
            break;
        text = text.substr(comma + 1);
    }
    return limit;
}

std::string limitText(const Limit &limit)
{
    std::string s = std::string(toName(limit.measure)) + "=" + formatShortest(limit.amount) + (limit.percentOfValue ? "%" : "");
    if (limit.warningLevel != 0.8)
        s += ",warn=" + formatShortest(limit.warningLevel * 100.0) + "%";
    if (!limit.group.empty())
        s += ",group=" + limit.group;
    return s;
}

Status checkLimits(const std::vector<Limit> &limits, const std::vector<std::string> &knownGroups, const std::string &option)
{
    for (const auto &l : limits) {
        if (!(l.amount > 0.0) || !std::isfinite(l.amount))
            return fieldError(ErrorKind::Value, option, limitText(l) + ": the limit must be greater than zero");
        if (!(l.warningLevel > 0.0 && l.warningLevel <= 1.0))
            return fieldError(ErrorKind::Value, option, limitText(l) + ": the warning level must be above 0% and at most 100%");
        if (l.group.empty())
            continue;
        bool known = false;
        for (const auto &g : knownGroups)
            known = known || g == l.group;
        if (!known) {
            std::string there;
            for (const auto &g : knownGroups)
                there += (there.empty() ? "" : ", ") + g;
            return fieldError(ErrorKind::Reference, option,
                              "unknown group \"" + l.group + "\" in " + limitText(l)
                                  + (knownGroups.empty() ? std::string(" (the holdings are in no groups; a limit can only be on the whole book)")
                                                         : " (the groups are: " + there + ")"));
        }
    }
    return Done{};
}

Result<std::vector<LimitUse>> evaluateLimits(const std::vector<Limit> &limits, const LimitFigures &figures)
{
    std::vector<LimitUse> out;
    for (const auto &l : limits) {
        LimitUse u;
        u.limit = l;
        if (l.percentOfValue) {
            if (!(figures.portfolioValue > 0.0))
                return fieldError(ErrorKind::Value, "limit",
                                  limitText(l) + ": a limit in percent of value needs a positive portfolio value, found "
                                      + formatShortest(figures.portfolioValue));
            u.limitMoney = l.amount / 100.0 * figures.portfolioValue;
        } else {
            u.limitMoney = l.amount;
        }
        u.value = l.measure == LimitMeasure::Var ? figures.var : figures.es;
        u.use = u.value / u.limitMoney;
        u.state = u.use > 1.0 ? LimitState::Breached : (u.use >= l.warningLevel ? LimitState::Warning : LimitState::Ok);
        out.push_back(u);
    }
    return out;
}

bool anyBreached(const std::vector<LimitUse> &uses)
{
    for (const auto &u : uses)
        if (u.state == LimitState::Breached)
            return true;
    return false;
}

} // namespace tailwise
