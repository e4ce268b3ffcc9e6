#pragma once

#include <string>
#include <vector>

#include <QObject>

QT_BEGIN_NAMESPACE
class QComboBox;
class QFormLayout;
class QLineEdit;
class QWidget;
QT_END_NAMESPACE

namespace ds {

class DesignDocument;
class QuantityEdit;

/// The design's body: a preset by name, or a body of the user's own ("custom") with its name,
/// radius, gravitational parameter, rotation and gas, each a field. Choosing "custom" starts
/// from the preset chosen before (its constants copied, and its standard atmosphere, which
/// only a preset has, as a table of itself); choosing a preset again replaces the custom body.
/// Every change is one undoable edit of the document. It adds its rows to the form it is given: the
/// choice, and under it the custom body's fields (shown only for one).
class BodyEditor : public QObject {
    Q_OBJECT
public:
    /// Adds the body's rows to `form`; their widgets are children of `parent`.
    BodyEditor(DesignDocument* document, QFormLayout* form, QWidget* parent);

    QComboBox* choice() const { return m_choice; }
    /// The field of a custom body's key ("radius_m"), for tests.
    QWidget* fieldFor(const std::string& key) const;

private:
    void refresh();
    void choose(int index);

    /// A number of the custom body bound to its key.
    struct Number {
        std::string key;
        QuantityEdit* edit;
        bool optional;
    };

    DesignDocument* m_document;
    QComboBox* m_choice;
    QWidget* m_custom;
    QLineEdit* m_name;
    std::vector<Number> m_numbers;
    std::vector<std::string> m_presets;
    bool m_refreshing = false;
};

}  // namespace ds
