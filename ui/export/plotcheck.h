// Whether a chart about to be painted onto paper or into a file holds only finite numbers.
//
// The chart data builders (charts/*chartdata.h) already drop or replace figures that are not
// finite; this is the last guard before SVG and PDF, where an infinite or undefined coordinate
// would be written into the file as text ("inf", "nan") that other programs reject. Checked:
// every axis range, every point of every graph, curve and bar set, every cell and range of a
// colour map, and every position of every item (lines, rectangles, labels) — of what is
// visible: a hidden mark is not painted and may hold anything.
#pragma once

#include <QString>

class QCustomPlot;

namespace tailwise::ui {

// Empty when every number the plot would paint is finite; otherwise a plain sentence naming the
// first part that is not ("the axis “Loss” has a range that is not a finite number").
QString nonFiniteInPlot(const QCustomPlot &plot);

} // namespace tailwise::ui
