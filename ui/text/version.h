// The version string shown in the window's About box and the report footer.
#pragma once

namespace tailwise::ui {

const char *versionText();

} // namespace tailwise::ui
