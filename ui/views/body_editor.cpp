#include "views/body_editor.hpp"

#include <QComboBox>
#include <QFormLayout>
#include <QLineEdit>
#include <QSignalBlocker>

#include "body/body.hpp"
#include "model/design_document.hpp"
#include "views/atmosphere_table.hpp"
#include "views/quantity_edit.hpp"
#include "views/wheel_guard.hpp"

namespace ds {
namespace {

using Json = DesignDocument::Json;

/// A custom body's number keys, as the form shows them. The bounds are the reader's.
struct BodyKey {
    const char* key;
    const char* label;
    Dimension dimension;
    std::optional<double> above;  ///< exclusive lower bound
    bool optional;
    const char* placeholder;
};

const BodyKey bodyKeys[] = {
    {"radius_m", QT_TRANSLATE_NOOP("ds::BodyEditor", "Radius"), Dimension::length, 0.0, false, ""},
    {"mu_m3_s2", QT_TRANSLATE_NOOP("ds::BodyEditor", "GM (m³/s²)"), Dimension::dimensionless, 0.0,
     false, ""},
    {"rotation_rad_s", QT_TRANSLATE_NOOP("ds::BodyEditor", "Rotation rate"),
     Dimension::angular_rate, std::nullopt, true,
     QT_TRANSLATE_NOOP("ds::BodyEditor", "0: not rotating")},
    {"gas_constant_J_kgK", QT_TRANSLATE_NOOP("ds::BodyEditor", "Gas constant"),
     Dimension::dimensionless, 0.0, true,
     QT_TRANSLATE_NOOP("ds::BodyEditor", "here or in the atmosphere")},
    {"gamma", QT_TRANSLATE_NOOP("ds::BodyEditor", "Ratio of specific heats"),
     Dimension::dimensionless, 1.0, true,
     QT_TRANSLATE_NOOP("ds::BodyEditor", "here or in the atmosphere")},
    {"sutton_graves_k", QT_TRANSLATE_NOOP("ds::BodyEditor", "Sutton-Graves k (kg½/m)"),
     Dimension::dimensionless, 0.0, false, ""},
};

const QString customText = QT_TRANSLATE_NOOP("ds::BodyEditor", "custom body");

/// A preset's constants as a custom body's keys, to start from.
Json customFrom(const Body& body) {
    return {{"name", body.name + " (edited)"},
            {"radius_m", body.radius_m},
            {"mu_m3_s2", body.mu_m3_s2},
            {"rotation_rad_s", body.rotation_rad_s},
            {"gas_constant_J_kgK", body.gas.gas_constant_J_kgK},
            {"gamma", body.gas.gamma},
            {"sutton_graves_k", body.gas.sutton_graves_k}};
}

}  // namespace

BodyEditor::BodyEditor(DesignDocument* document, QFormLayout* form, QWidget* parent)
    : QObject(parent), m_document(document), m_presets(body_preset_names()) {
    m_choice = new QComboBox(parent);
    m_choice->setObjectName(QStringLiteral("/body"));
    guardWheel(m_choice);
    for (const std::string& name : m_presets) {
        QString shown = QString::fromStdString(name);
        if (!shown.isEmpty())
            shown[0] = shown[0].toUpper();
        m_choice->addItem(tr(shown.toUtf8().constData()));
    }
    m_choice->addItem(tr(customText.toUtf8().constData()));
    m_choice->setToolTip(
        tr("A preset body, or one of your own: choosing \"custom body\" copies "
           "the preset's constants into fields to edit."));
    m_choice->setSizeAdjustPolicy(QComboBox::AdjustToMinimumContentsLengthWithIcon);
    form->addRow(tr("Body"), m_choice);

    // The custom body's fields in a block of their own under the choice, the form's whole
    // width: shown and hidden as one.
    m_custom = new QWidget(parent);
    auto* custom = new QFormLayout(m_custom);
    custom->setContentsMargins(0, 0, 0, 0);
    custom->setFieldGrowthPolicy(QFormLayout::AllNonFixedFieldsGrow);
    form->addRow(m_custom);
    m_name = new QLineEdit(m_custom);
    m_name->setObjectName(QStringLiteral("/body/name"));
    custom->addRow(tr("Name"), m_name);
    connect(m_name, &QLineEdit::editingFinished, this, [this] {
        const QString name = m_name->text().trimmed();
        if (!m_refreshing && !name.isEmpty() &&
            m_document->value("/body/name") != Json(name.toStdString()))
            m_document->setValue("/body/name", name.toStdString(), tr("Name the body"));
    });
    for (const BodyKey& k : bodyKeys) {
        QuantityRange range;
        if (k.above) {
            range.minimum = k.above;
            range.minimumExclusive = true;
        }
        auto* edit = new QuantityEdit(k.dimension, range, m_custom);
        const std::string pointer = std::string("/body/") + k.key;
        edit->setObjectName(QString::fromStdString(pointer));
        if (*k.placeholder)
            edit->setPlaceholderText(tr(k.placeholder));
        const QString label = tr(k.label);
        edit->setAccessibleName(tr("Body: %1").arg(label));
        custom->addRow(label, edit);
        m_numbers.push_back({k.key, edit, k.optional});
        connect(edit, &QuantityEdit::valueEdited, this, [this, pointer, label](double value) {
            if (!m_refreshing)
                m_document->setValue(pointer, value, tr("Set the body's %1").arg(label.toLower()));
        });
        if (k.optional) {
            connect(edit, &QLineEdit::editingFinished, this, [this, pointer, edit, label] {
                if (m_refreshing || !edit->text().trimmed().isEmpty() ||
                    m_document->value(pointer).is_null())
                    return;
                m_document->setValue(pointer, Json(),
                                     tr("Clear the body's %1").arg(label.toLower()));
            });
        }
    }
    connect(m_choice, &QComboBox::activated, this, &BodyEditor::choose);
    connect(m_document, &DesignDocument::changed, this, &BodyEditor::refresh);
    refresh();
}

void BodyEditor::choose(int index) {
    const Json body = m_document->value("/body");
    if (index >= 0 && index < static_cast<int>(m_presets.size())) {
        const std::string& name = m_presets[static_cast<std::size_t>(index)];
        if (body != Json(name))
            m_document->setValue("/body", name, tr("Set the body"));
        return;
    }
    if (body.is_object())
        return;  // custom already
    // From the preset the design had (Mars when it had none the reader knows).
    const std::optional<Body> preset =
        body_preset(body.is_string() ? body.get<std::string>() : std::string("mars"));
    std::vector<std::pair<std::string, Json>> values{
        {"/body", customFrom(preset ? *preset : *body_preset("mars"))}};
    // A preset's standard atmosphere has no meaning for a body of one's own: it becomes a
    // table of itself, sampled from the site to the interface, in the same edit.
    if (m_document->value("/atmosphere/model") == Json("standard")) {
        values.emplace_back("/atmosphere/model", "table");
        values.emplace_back("/atmosphere/rows", AtmosphereTable::startingRows(*m_document));
    }
    m_document->setValues(values, tr("Describe a body of your own"));
}

void BodyEditor::refresh() {
    m_refreshing = true;
    const Json body = m_document->value("/body");
    int index = -1;
    for (std::size_t i = 0; i < m_presets.size(); ++i) {
        if (body == Json(m_presets[i]))
            index = static_cast<int>(i);
    }
    if (body.is_object())
        index = static_cast<int>(m_presets.size());
    {
        const QSignalBlocker block(m_choice);
        m_choice->setCurrentIndex(index);
    }
    m_custom->setVisible(body.is_object());
    if (body.is_object()) {
        const Json name = body.value("name", Json());
        m_name->setText(name.is_string() ? QString::fromStdString(name.get<std::string>())
                                         : QString());
        for (Number& n : m_numbers) {
            const Json v = body.value(n.key, Json());
            n.edit->setValue(v.is_number() ? std::optional<double>(v.get<double>()) : std::nullopt);
        }
        // The reader's errors at the body's fields.
        for (const ReadError& error : m_document->errors()) {
            for (Number& n : m_numbers) {
                if (error.path == "body." + n.key)
                    n.edit->setExternalError(QString::fromStdString(error.message));
            }
        }
    }
    m_refreshing = false;
}

QWidget* BodyEditor::fieldFor(const std::string& key) const {
    if (key == "name")
        return m_name;
    for (const Number& n : m_numbers) {
        if (n.key == key)
            return n.edit;
    }
    return nullptr;
}

}  // namespace ds
