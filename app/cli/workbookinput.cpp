#include "workbookinput.h"

#include "document/workbookfile.h"

#include <QFile>

namespace tailwise::cli {

std::optional<std::string> workbookOption(const std::vector<std::string> &args)
{
    // The last one wins, as for every other option (parseVarOptions).
    std::optional<std::string> path;
    for (std::size_t i = 0; i + 1 < args.size(); ++i)
        if (args[i] == "--workbook")
            path = args[++i];
    return path;
}

Result<ui::WorkbookContents> readWorkbookInput(const std::string &path)
{
    // File names are bytes on Linux; decodeName maps them the way QFile opens them.
    return ui::loadWorkbook(QFile::decodeName(path.c_str()));
}

} // namespace tailwise::cli
