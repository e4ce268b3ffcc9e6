#include "views/quantity_edit.hpp"

#include <QStyle>

namespace ds {
namespace {

// The field is marked through a dynamic property, so a stylesheet of the application may
// restyle it; this one is the default.
constexpr const char* invalidProperty = "invalid";
constexpr const char* invalidStyle = "QLineEdit[invalid=\"true\"] { border: 1px solid #c62828; }";

/// "2.6 m", or "0.8" for a bare number.
QString withUnit(double value, Dimension dimension) {
    const QString number = QString::fromStdString(formatQuantity(value));
    const auto unit = siUnit(dimension);
    return unit.empty() ? number : number + ' ' + QString::fromUtf8(unit.data(), unit.size());
}

/// Why a value of the document's unit lies outside the range, or empty.
QString rangeError(double value, const QuantityRange& range, Dimension dimension) {
    if (range.minimum) {
        const double low = *range.minimum;
        if (range.minimumExclusive && value <= low) {
            return low == 0.0 ? QStringLiteral("must be positive")
                              : "must be more than " + withUnit(low, dimension);
        }
        if (!range.minimumExclusive && value < low) {
            return low == 0.0 ? QStringLiteral("must not be negative")
                              : "must be at least " + withUnit(low, dimension);
        }
    }
    if (range.maximum) {
        const double high = *range.maximum;
        if (range.maximumExclusive && value >= high) {
            return "must be less than " + withUnit(high, dimension);
        }
        if (!range.maximumExclusive && value > high) {
            return "must be at most " + withUnit(high, dimension);
        }
    }
    return {};
}

/// "typically 2 to 5 m; also accepts km, cm, ..." for the tooltip of a valid field.
QString description(const QuantityRange& range, Dimension dimension) {
    QStringList parts;
    if (range.typicalLow != 0.0 || range.typicalHigh != 0.0) {
        parts << "typically " + QString::fromStdString(formatQuantity(range.typicalLow)) + " to " +
                     withUnit(range.typicalHigh, dimension);
    }
    QStringList others;
    for (const auto& unit : unitsOf(dimension).subspan(1)) {
        others << QString::fromUtf8(unit.symbol.data(), unit.symbol.size());
    }
    if (!others.isEmpty()) {
        parts << "also accepts " + others.join(QStringLiteral(", "));
    }
    return parts.join(QStringLiteral("; "));
}

}  // namespace

QuantityEdit::QuantityEdit(Dimension dimension, QuantityRange range, QWidget* parent)
    : QLineEdit(parent), m_dimension(dimension), m_range(range) {
    setStyleSheet(QString::fromLatin1(invalidStyle));
    const auto unit = siUnit(dimension);
    setPlaceholderText(QString::fromUtf8(unit.data(), unit.size()));
    connect(this, &QLineEdit::editingFinished, this, &QuantityEdit::commit);
    showState();
}

void QuantityEdit::setRange(const QuantityRange& range) {
    if (range == m_range)
        return;  // the state shown is of this range already
    m_range = range;
    showState();
}

void QuantityEdit::setRefusal(const QString& error) {
    const bool was = isRefused();
    m_error = error;
    if (was != isRefused())
        emit refusalChanged(isRefused());
}

void QuantityEdit::setValue(std::optional<double> value) {
    m_value = value;
    setRefusal({});
    m_externalError.clear();
    setText(value ? withUnit(*value, m_dimension) : QString());
    showState();
}

void QuantityEdit::setExternalError(const QString& error) {
    if (error == m_externalError)
        return;  // the state shown is of this error already
    m_externalError = error;
    showState();
}

void QuantityEdit::commit() {
    const QString typed = text().trimmed();
    const QString shown = m_value ? withUnit(*m_value, m_dimension) : QString();
    if (typed == shown) {
        // Nothing was edited (or an edit was typed back): re-reading the rounded text would
        // change the value by its rounding.
        setRefusal({});
        setText(shown);
        showState();
        return;
    }
    const ParsedQuantity parsed = typed.isEmpty() ? ParsedQuantity{std::nullopt, "needs a value"}
                                                  : parseQuantity(typed.toStdString(), m_dimension);
    setRefusal(parsed.value ? rangeError(*parsed.value, m_range, m_dimension)
                            : QString::fromStdString(parsed.error));
    if (isRefused()) {
        showState();
        return;
    }
    const double value = *parsed.value;
    const bool changed = m_value != value;
    m_value = value;
    m_externalError.clear();
    setText(withUnit(value, m_dimension));
    showState();
    if (changed) {
        emit valueEdited(value);
    }
}

void QuantityEdit::showState() {
    const QString reason = m_error.isEmpty() ? m_externalError : m_error;
    setToolTip(reason.isEmpty() ? description(m_range, m_dimension) : reason);
    const bool invalid = !reason.isEmpty();
    if (property(invalidProperty).toBool() != invalid) {
        setProperty(invalidProperty, invalid);
        style()->unpolish(this);  // re-evaluates the stylesheet's property selector
        style()->polish(this);
    }
}

}  // namespace ds
