#pragma once

#include <functional>
#include <string>
#include <vector>

#include <QWidget>

#include "units/quantity.hpp"
#include "views/quantity_edit.hpp"

QT_BEGIN_NAMESPACE
class QComboBox;
class QFormLayout;
class QLabel;
class QTableWidget;
class QVBoxLayout;
QT_END_NAMESPACE

namespace ds {

class DesignDocument;

/// The design as forms, grouped in the order the vehicle meets them: body and site, entry,
/// aeroshell, drag devices, terminal descent, sequence, mass budget, limits. Every field is
/// bound to a key of the document by its JSON pointer; an edit goes to the document as one
/// undoable change, and the form redraws from the document on every change.
class DesignForm : public QWidget {
    Q_OBJECT
public:
    explicit DesignForm(DesignDocument* document, QWidget* parent = nullptr);

    /// Shows and focuses the field of a key ("/entry/velocity_m_s"); false when there is none.
    bool focusField(const std::string& pointer);
    /// The field bound to a key, for tests.
    QWidget* fieldFor(const std::string& pointer) const;

private:
    /// A number field bound to a key. Optional keys are removed when the field is emptied.
    struct NumberBinding {
        std::string pointer;
        QuantityEdit* edit;
        bool optional;
        QWidget* row;  ///< label and field, for showing and hiding
    };
    /// A choice bound to a key holding one of several strings.
    struct ChoiceBinding {
        std::string pointer;
        QComboBox* combo;
        std::vector<std::string> values;
    };
    /// A choice between shapes of a part of the document (which trigger key, a size or a
    /// sizing request): reads which shape the document has, and rewrites it to another.
    struct ShapeBinding {
        QComboBox* combo;
        std::function<int()> current;
        std::function<void(int)> select;
    };

    QFormLayout* addSection(const QString& title);
    QuantityEdit* addNumber(QFormLayout* form, const QString& label, const std::string& pointer,
                            Dimension dimension, QuantityRange range, bool optional,
                            const QString& placeholder = {});
    QComboBox* addChoice(QFormLayout* form, const QString& label, const std::string& pointer,
                         const std::vector<std::pair<QString, std::string>>& choices);
    QComboBox* addShape(QFormLayout* form, const QString& label, const QStringList& shapes,
                        std::function<int()> current, std::function<void(int)> select);
    void addTrigger(QFormLayout* form, const std::string& object);

    void buildBodyAndSite();
    void buildEntry();
    void buildAeroshell();
    void buildDragDevices();
    void buildTerminal();
    void buildSequence();
    void buildMass();
    void buildLimits();

    void refresh();
    void refreshItems();
    void writeItems();
    void setRowVisible(const std::string& pointer, bool visible);

    DesignDocument* m_document;
    QVBoxLayout* m_sections;
    QLabel* m_documentErrors;
    QTableWidget* m_items = nullptr;
    std::vector<NumberBinding> m_numbers;
    std::vector<ChoiceBinding> m_choices;
    std::vector<ShapeBinding> m_shapes;
    bool m_refreshing = false;
};

}  // namespace ds
