#include "text/version.h"

// The version string shown in the window's About box and the report footer.
namespace tailwise::ui {
const char *versionText() { return "0.1.0"; }
} // namespace tailwise::ui
