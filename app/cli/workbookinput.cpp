#include "workbookinput.h"

#include "document/workbookfile.h"

#include <QFile>

namespace tailwise::cli {

Result<ui::WorkbookContents> readWorkbookInput(const std::string &path)
{
    // File names are bytes on Linux; decodeName maps them the way QFile opens them.
    return ui::loadWorkbook(QFile::decodeName(path.c_str()));
}

} // namespace tailwise::cli
