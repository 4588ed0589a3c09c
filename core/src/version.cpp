#include "tailwise/version.h"

#ifndef TAILWISE_VERSION
#error "TAILWISE_VERSION is defined by core/CMakeLists.txt"
#endif

namespace tailwise {

const char *toolVersion() { return TAILWISE_VERSION; }

} // namespace tailwise
