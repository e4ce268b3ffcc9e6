#pragma once

#include <QTableWidget>

#include "results/results.hpp"

namespace ds {

/// The key figures in a compact table: value, unit, and, when a baseline is pinned, the
/// difference from it.
class FiguresView : public QTableWidget {
    Q_OBJECT
public:
    explicit FiguresView(QWidget* parent = nullptr);

    /// Marks the results shown as stale (greyed) or current.
    void setStale(bool stale);
    bool isStale() const { return m_stale; }

    void setResults(const Results& results, const Results* baseline);

private:
    bool m_stale = false;
};

}  // namespace ds
