#include "trade/contour.hpp"

#include <array>
#include <cmath>
#include <stdexcept>

namespace ds {
namespace {

struct Corner {
    double x = 0.0;
    double y = 0.0;
    double value = 0.0;
};

/// Where the edge from a to b crosses zero (their values have opposite signs).
std::array<double, 2> crossing(const Corner& a, const Corner& b) {
    const double t = a.value / (a.value - b.value);
    return {a.x + t * (b.x - a.x), a.y + t * (b.y - a.y)};
}

void add(std::vector<ContourSegment>& out, std::array<double, 2> p, std::array<double, 2> q) {
    out.push_back({p[0], p[1], q[0], q[1]});
}

}  // namespace

std::vector<ContourSegment> zero_contour(const std::vector<double>& x, const std::vector<double>& y,
                                         const std::vector<double>& values) {
    if (values.size() != x.size() * y.size()) {
        throw std::invalid_argument("zero_contour: values must hold x.size() * y.size() samples");
    }
    std::vector<ContourSegment> segments;
    const std::size_t ny = y.size();
    for (std::size_t i = 0; i + 1 < x.size(); ++i) {
        for (std::size_t j = 0; j + 1 < ny; ++j) {
            // Corners counter-clockwise from (x_i, y_j); edges k join corner k to k + 1.
            const std::array<Corner, 4> c{{{x[i], y[j], values[i * ny + j]},
                                           {x[i + 1], y[j], values[(i + 1) * ny + j]},
                                           {x[i + 1], y[j + 1], values[(i + 1) * ny + j + 1]},
                                           {x[i], y[j + 1], values[i * ny + j + 1]}}};
            bool finite = true;
            for (const Corner& corner : c)
                finite = finite && std::isfinite(corner.value);
            if (!finite)
                continue;
            std::array<bool, 4> inside{};
            for (int k = 0; k < 4; ++k)
                inside[k] = c[k].value >= 0.0;
            std::vector<int> cut;  // edges whose ends differ, in order around the cell
            for (int k = 0; k < 4; ++k) {
                if (inside[k] != inside[(k + 1) % 4])
                    cut.push_back(k);
            }
            const auto at = [&](int k) { return crossing(c[k], c[(k + 1) % 4]); };
            if (cut.size() == 2) {
                add(segments, at(cut[0]), at(cut[1]));
            } else if (cut.size() == 4) {
                // A saddle: join the crossings around the corners whose sign the centre does
                // not share, so the centre's side stays connected.
                const double centre = (c[0].value + c[1].value + c[2].value + c[3].value) / 4.0;
                const bool centreInside = centre >= 0.0;
                if (inside[0] != centreInside) {  // corners 0 and 2 are cut off
                    add(segments, at(3), at(0));
                    add(segments, at(1), at(2));
                } else {  // corners 1 and 3 are cut off
                    add(segments, at(0), at(1));
                    add(segments, at(2), at(3));
                }
            }
        }
    }
    return segments;
}

}  // namespace ds
