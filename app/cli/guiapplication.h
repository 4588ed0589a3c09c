// The Qt application that drawing commands need (the charts are widgets, even off-screen).
//
// Made on demand, only by the commands that draw (render): var, backtest and pack never make one,
// so they run where Qt's GUI cannot start. With no QT_QPA_PLATFORM set it picks Qt's offscreen
// platform itself, so rendering works with no display. Under the C locale (no LANG, as on build
// machines) numbers keep the C form but with thousands separators, as the charts promise.
#pragma once

#include <memory>

class QApplication;

namespace tailwise::cli {

// The QApplication for a drawing command; the caller keeps it while it draws and lets it go
// before main returns (a QApplication destroyed among the static destructors crashes).
std::unique_ptr<QApplication> makeGuiApplication();

} // namespace tailwise::cli
