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
class QPushButton;
class QTableWidget;
class QVBoxLayout;
QT_END_NAMESPACE

namespace ds {

class BodyEditor;
class DesignDocument;
struct KeyGroup;
struct KeyRow;
struct SectionRow;

/// The design as forms, grouped in the order the vehicle meets them: body and site, entry,
/// aeroshell, drag devices, terminal descent, sequence, mass budget, limits. The fields, their
/// labels, ranges, placeholders, visibility and the values a change of shape fills in all come
/// from the design schema (core/design/schema.hpp). Every field is bound to a key of the
/// document by its JSON pointer; an edit goes to the document as one undoable change, and the
/// form redraws from the document on every change.
class DesignForm : public QWidget {
    Q_OBJECT
public:
    explicit DesignForm(DesignDocument* document, QWidget* parent = nullptr);

    /// Shows and focuses the field of a key ("/entry/velocity_m_s"), or of the alternative of its
    /// group that the document gives; false when there is none.
    bool focusField(const std::string& pointer);
    /// The field bound to a key, for tests.
    QWidget* fieldFor(const std::string& pointer) const;
    /// The fields holding a value they refused, each as "label: reason"; the design keeps
    /// the values before them, and so do the results shown.
    QStringList refusedFields() const;

signals:
    /// A field came to hold a refused value, or no longer does.
    void refusalsChanged();

private:
    /// A number field bound to a key. Optional keys are removed when the field is emptied.
    struct NumberBinding {
        std::string pointer;
        QuantityEdit* edit;
        bool optional;
        QWidget* row;       ///< label and field, for showing and hiding
        const KeyRow* key;  ///< its schema row
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
        /// A key of the part the choice is made in (a trigger of the decelerator, an aim of the
        /// approach): the choice shows only while the part is there; null: always.
        const KeyRow* part = nullptr;
    };

    QFormLayout* addSection(const QString& title);
    /// A drop-down box of the form: the wheel passes it by, and it is no wider than it must be.
    QComboBox* formCombo();
    QuantityEdit* addNumber(QFormLayout* form, const KeyRow& key);
    QComboBox* addChoice(QFormLayout* form, const QString& label, const std::string& pointer,
                         const std::vector<std::pair<QString, std::string>>& choices);
    /// A choice between shapes, named for tests: the selector's pointer ("/terminal/method"),
    /// or a part's pointer with what it chooses ("/parachute#deploy trigger",
    /// "/aeroshell/diameter_m#sizing", "/decelerator#presence").
    QComboBox* addShape(QFormLayout* form, const QString& name, const QString& label,
                        const QStringList& shapes, std::function<int()> current,
                        std::function<void(int)> select);

    /// The fields of one object of the document, row by row of the schema.
    void buildPart(QFormLayout* form, const SectionRow& section);
    /// A part the design may lack (the decelerator): none, or the part with its fallbacks.
    void addPresence(QFormLayout* form, const SectionRow& section);
    /// A choice whose value decides which keys of its object apply (model, method).
    void addSelector(QFormLayout* form, const KeyRow& selector);
    /// One key of a group of alternatives (a trigger, a jettison rule).
    void addGroup(QFormLayout* form, const KeyRow& first);
    /// Where the entry starts: the state given at the interface (`first`, the first key the
    /// objects stand in place of), or one of the objects (an approach, an orbit).
    void addStart(QFormLayout* form, const KeyRow& first);
    /// A number or a sizing request.
    void addNumberOrRequest(QFormLayout* form, const KeyRow& key);
    void buildItems(QFormLayout* form);
    /// An editor of its own for a key read by hand (the wind, a table atmosphere's rows),
    /// shown while the key applies.
    void addByHand(QFormLayout* form, const QString& label, const KeyRow& key, QWidget* editor);
    /// Whether a key applies to the document as it is (its model, method, group and shape).
    bool applies(const KeyRow& key) const;
    /// Whether the part a key sits in is there: its section (the decelerator), and the object
    /// or the sizing request it is a key of.
    bool partPresent(const KeyRow& key) const;

    void refresh();
    void refreshItems();
    void writeItems();
    void setRowVisible(const std::string& pointer, bool visible);
    /// Shows or hides a field of the form with its label.
    void setFieldVisible(QWidget* field, bool visible);

    DesignDocument* m_document;
    QVBoxLayout* m_sections;
    QLabel* m_documentErrors;
    QPushButton* m_dropUnused;
    QTableWidget* m_items = nullptr;
    BodyEditor* m_body = nullptr;
    std::vector<NumberBinding> m_numbers;
    std::vector<ChoiceBinding> m_choices;
    std::vector<ShapeBinding> m_shapes;
    std::vector<std::pair<const KeyRow*, QWidget*>> m_byHand;
    bool m_refreshing = false;
};

}  // namespace ds
