#include "charts/contours.h"

#include <cmath>
#include <cstdint>
#include <unordered_map>

namespace tailwise::ui {

namespace {

// A crossing point is named by the grid edge it lies on, so the two cells that share an edge
// name the same point exactly, and joining segments needs no floating-point comparison.
using EdgeKey = std::uint64_t;
EdgeKey horizontalEdge(std::size_t i, std::size_t j) { return (static_cast<EdgeKey>(i) << 33) | (static_cast<EdgeKey>(j) << 1); }
EdgeKey verticalEdge(std::size_t i, std::size_t j) { return horizontalEdge(i, j) | 1u; }

struct Segment {
    EdgeKey a, b;
    bool used = false;
};

} // namespace

std::vector<ContourLine> contourLines(std::span<const double> xs, std::span<const double> ys,
                                      std::span<const double> values, double level)
{
    const std::size_t nx = xs.size();
    const std::size_t ny = ys.size();
    std::vector<ContourLine> lines;
    if (nx < 2 || ny < 2 || values.size() != nx * ny || !std::isfinite(level))
        return lines;
    auto v = [&](std::size_t i, std::size_t j) { return values[i * ny + j]; };

    std::unordered_map<EdgeKey, ContourPoint> points;
    std::vector<Segment> segments;
    // Crossing on the edge from grid node (i0,j0) to (i1,j1); the caller knows it is crossed.
    auto crossing = [&](EdgeKey key, std::size_t i0, std::size_t j0, std::size_t i1, std::size_t j1) {
        if (points.count(key) == 0) {
            const double v0 = v(i0, j0), v1 = v(i1, j1);
            const double t = (level - v0) / (v1 - v0); // v0 ≠ v1: the ends lie on different sides
            points[key] = ContourPoint{xs[i0] + t * (xs[i1] - xs[i0]), ys[j0] + t * (ys[j1] - ys[j0])};
        }
        return key;
    };

    for (std::size_t i = 0; i + 1 < nx; ++i) {
        for (std::size_t j = 0; j + 1 < ny; ++j) {
            // Corners: a (i,j), b (i+1,j), c (i+1,j+1), d (i,j+1).
            const double va = v(i, j), vb = v(i + 1, j), vc = v(i + 1, j + 1), vd = v(i, j + 1);
            if (!std::isfinite(va) || !std::isfinite(vb) || !std::isfinite(vc) || !std::isfinite(vd))
                continue;
            const bool a = va >= level, b = vb >= level, c = vc >= level, d = vd >= level;
            const int index = (a ? 1 : 0) | (b ? 2 : 0) | (c ? 4 : 0) | (d ? 8 : 0);
            if (index == 0 || index == 15)
                continue;
            // Edges: bottom a–b, right b–c, top d–c, left a–d.
            EdgeKey bottom = 0, right = 0, top = 0, left = 0;
            if (a != b) bottom = crossing(horizontalEdge(i, j), i, j, i + 1, j);
            if (b != c) right = crossing(verticalEdge(i + 1, j), i + 1, j, i + 1, j + 1);
            if (d != c) top = crossing(horizontalEdge(i, j + 1), i, j + 1, i + 1, j + 1);
            if (a != d) left = crossing(verticalEdge(i, j), i, j, i, j + 1);
            if (index == 5 || index == 10) {
                // Saddle: the centre decides which pair of opposite corners is joined.
                const bool centreAbove = 0.25 * (va + vb + vc + vd) >= level;
                const bool cutOffAandC = (index == 5) != centreAbove; // isolate corners a and c
                if (cutOffAandC) {
                    segments.push_back({left, bottom});
                    segments.push_back({right, top});
                } else {
                    segments.push_back({bottom, right});
                    segments.push_back({top, left});
                }
                continue;
            }
            EdgeKey ends[4];
            int n = 0;
            if (a != b) ends[n++] = bottom;
            if (b != c) ends[n++] = right;
            if (d != c) ends[n++] = top;
            if (a != d) ends[n++] = left;
            if (n == 2) // always so outside the saddles
                segments.push_back({ends[0], ends[1]});
        }
    }

    // Join segments through shared edges: each edge point touches at most two segments.
    std::unordered_map<EdgeKey, std::vector<std::size_t>> touching;
    for (std::size_t s = 0; s < segments.size(); ++s) {
        touching[segments[s].a].push_back(s);
        touching[segments[s].b].push_back(s);
    }
    auto walk = [&](std::size_t start, EdgeKey from) {
        ContourLine line;
        line.push_back(points[from]);
        EdgeKey at = from;
        std::size_t s = start;
        while (true) {
            segments[s].used = true;
            const EdgeKey next = segments[s].a == at ? segments[s].b : segments[s].a;
            line.push_back(points[next]);
            at = next;
            std::size_t following = segments.size();
            for (std::size_t t : touching[at])
                if (!segments[t].used)
                    following = t;
            if (following == segments.size())
                break;
            s = following;
        }
        return line;
    };
    // Open lines first, from an end that only one segment touches; then the closed loops.
    for (auto &[key, list] : touching)
        if (list.size() == 1 && !segments[list[0]].used)
            lines.push_back(walk(list[0], key));
    for (std::size_t s = 0; s < segments.size(); ++s)
        if (!segments[s].used)
            lines.push_back(walk(s, segments[s].a));
    return lines;
}

} // namespace tailwise::ui
