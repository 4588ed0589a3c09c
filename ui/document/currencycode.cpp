#include "currencycode.h"

namespace tailwise::ui {

bool isCurrencyCode(const QString &text)
{
    if (text.size() != 3)
        return false;
    for (QChar ch : text)
        if (ch < QLatin1Char('A') || ch > QLatin1Char('Z'))
            return false;
    return true;
}

tailwise::Result<QString> parseCurrencyCode(const QString &text, const std::string &field)
{
    const QString code = text.trimmed();
    if (code.isEmpty() || isCurrencyCode(code))
        return code;
    return tailwise::fieldError(tailwise::ErrorKind::Value, field,
                                "expected a currency code of three capital letters (e.g. EUR, GBP, USD), found \""
                                    + code.toStdString() + "\"");
}

} // namespace tailwise::ui
