#pragma once

#include <optional>

#include <QLineEdit>

#include "units/quantity.hpp"

namespace ds {

/// The admissible and the typical values of a field, in the document's unit.
struct QuantityRange {
    std::optional<double> minimum;  ///< inclusive unless minimumExclusive
    std::optional<double> maximum;  ///< inclusive unless maximumExclusive
    bool minimumExclusive = false;
    bool maximumExclusive = false;
    double typicalLow = 0.0;  ///< for the tooltip: "typically 2 to 5 m"
    double typicalHigh = 0.0;

    bool operator==(const QuantityRange&) const = default;
};

/// A number field with a unit: shows the value in the document's unit with the unit beside it,
/// accepts another unit typed after the number and converts it, and refuses an invalid value
/// at the field (red frame, the reason in the tooltip) so it never reaches the design.
class QuantityEdit : public QLineEdit {
    Q_OBJECT
public:
    QuantityEdit(Dimension dimension, QuantityRange range, QWidget* parent = nullptr);

    Dimension dimension() const { return m_dimension; }
    std::optional<double> value() const { return m_value; }
    /// Shows a value without emitting valueEdited (for model-to-view updates).
    void setValue(std::optional<double> value);
    /// Its bounds and typical values (the tooltip says them).
    void setRange(const QuantityRange& range);
    /// The reason shown at the field: the typed text's, else the reader's; empty when none.
    QString errorText() const { return m_error.isEmpty() ? m_externalError : m_error; }
    /// An error found elsewhere (the design reader) for this field; empty clears it.
    void setExternalError(const QString& error);
    /// Whether the field holds text it refused (the design keeps its previous value).
    bool isRefused() const { return !m_error.isEmpty(); }

signals:
    /// A valid value the user entered (on Enter or leaving the field), in the document's unit.
    void valueEdited(double value);
    /// The field came to hold refused text, or no longer does.
    void refusalChanged(bool refused);

private:
    void commit();
    /// Sets the reason the typed text was refused (empty: none) and says so when that changes.
    void setRefusal(const QString& error);
    void showState();

    Dimension m_dimension;
    QuantityRange m_range;
    std::optional<double> m_value;
    QString m_error;
    QString m_externalError;
};

}  // namespace ds
