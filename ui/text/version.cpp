#include "text/version.h"

#include "tailwise/version.h"

// The version string shown in the window's About box and the report: the build's own
// (tailwise/version.h), the same the command line writes as tool_version.
namespace tailwise::ui {
const char *versionText() { return tailwise::toolVersion(); }
} // namespace tailwise::ui
