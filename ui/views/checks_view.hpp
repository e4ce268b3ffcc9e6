#pragma once

#include <string>

#include <QTableWidget>

#include "results/results.hpp"

namespace ds {

/// Every check with its status, value, limit, the reason in words and the limit's source,
/// failing first. Activating a check asks for the design field that drives it.
class ChecksView : public QTableWidget {
    Q_OBJECT
public:
    explicit ChecksView(QWidget* parent = nullptr);

    /// Marks the results shown as stale (greyed) or current.
    void setStale(bool stale);
    bool isStale() const { return m_stale; }

    void setResults(const Results& results);

    /// The design key (a JSON pointer) a check's figure depends on most directly, from the
    /// schema's check-to-key table (core/design/schema.hpp).
    static std::string fieldForCheck(const std::string& checkId);

signals:
    void fieldRequested(const QString& pointer);

private:
    bool m_stale = false;
};

}  // namespace ds
