// The tool's version, as the build states it (CMake's PROJECT_VERSION): written into every JSON
// output, report and recorded run, so that a figure can be traced to the program that made it.
#pragma once

namespace tailwise {

const char *toolVersion();

} // namespace tailwise
