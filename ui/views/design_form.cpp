#include "views/design_form.hpp"

#include <QComboBox>
#include <QCoreApplication>
#include <QFormLayout>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QPushButton>
#include <QScrollArea>
#include <QScrollBar>
#include <QSignalBlocker>
#include <QTableWidget>
#include <QVBoxLayout>

#include "design/design.hpp"
#include "design/key_path.hpp"
#include "design/schema.hpp"
#include "model/design_document.hpp"
#include "views/atmosphere_table.hpp"
#include "views/body_editor.hpp"
#include "views/wheel_guard.hpp"
#include "views/wind_table.hpp"

namespace ds {
namespace {

using Json = DesignDocument::Json;

/// The form's groups, in the order the vehicle meets them, and the document's objects each
/// shows (in this order); within an object the fields follow the schema's rows.
struct FormSection {
    const char* title;
    std::vector<std::string_view> parts;
};
const std::vector<FormSection> formSections{
    {QT_TRANSLATE_NOOP("ds::DesignForm", "Body and landing site"), {"body", "site", "atmosphere"}},
    {QT_TRANSLATE_NOOP("ds::DesignForm", "Entry state"), {"entry"}},
    {QT_TRANSLATE_NOOP("ds::DesignForm", "Aeroshell"), {"aeroshell"}},
    {QT_TRANSLATE_NOOP("ds::DesignForm", "Drag devices"), {"decelerator", "drogue", "parachute"}},
    {QT_TRANSLATE_NOOP("ds::DesignForm", "Terminal descent"), {"terminal"}},
    {QT_TRANSLATE_NOOP("ds::DesignForm", "Sequence after deploy"), {"sequence"}},
    {QT_TRANSLATE_NOOP("ds::DesignForm", "Mass budget"), {"mass"}},
    {QT_TRANSLATE_NOOP("ds::DesignForm", "Limits"), {"limits"}},
};

/// What a drop-down box of the form shows at least, in characters.
constexpr int minimumChoiceCharacters = 12;

QString fromView(std::string_view s) {
    return QString::fromUtf8(s.data(), static_cast<qsizetype>(s.size()));
}

/// The schema's words (labels, shape texts), through the translator.
QString words(std::string_view s) {
    return QCoreApplication::translate("ds::DesignForm", std::string(s).c_str());
}

std::string pointerOf(const KeyRow& key) {
    return key_to_pointer(key.path());
}

/// "/decelerator" for an object of the document.
std::string pointerOf(const SectionRow& section) {
    return key_to_pointer(section.name);
}

/// The dimension of a key's unit: the one whose document unit it is.
Dimension dimensionOfUnit(std::string_view unit) {
    for (int d = 0; d <= static_cast<int>(Dimension::force); ++d) {
        if (siUnit(static_cast<Dimension>(d)) == unit)
            return static_cast<Dimension>(d);
    }
    return Dimension::dimensionless;
}

/// The field's bounds are the reader's (the looser of a terminal key's two), its typical range
/// the schema's on the design's body (a preset's name; empty for a custom body), or the
/// default.
QuantityRange quantityRange(const KeyRow& key, std::string_view body) {
    const ValueRange& r = key.on_canopy ? key.on_canopy->range : key.range;
    QuantityRange range;
    range.minimum = r.above ? r.above : r.at_least;
    range.minimumExclusive = r.above.has_value();
    range.maximum = r.below ? r.below : r.at_most;
    range.maximumExclusive = r.below.has_value();
    if (const auto typical = typical_range(key, body)) {
        range.typicalLow = typical->first;
        range.typicalHigh = typical->second;
    } else if (const auto fallback = default_of(key)) {
        range.typicalLow = range.typicalHigh = *fallback;
    }
    return range;
}

/// What an empty field means: the schema's words, or the default with its unit.
QString placeholderOf(const KeyRow& key) {
    if (!key.placeholder.empty())
        return words(key.placeholder);
    const auto fallback = default_of(key);
    if (!fallback)
        return {};
    QString shown = QString::fromStdString(formatQuantity(*fallback));
    if (!key.unit.empty())
        shown += " " + fromView(key.unit);
    return shown;
}

/// The group's keys in its object, in order.
std::vector<const KeyRow*> membersOf(const KeyRow& first) {
    std::vector<const KeyRow*> members;
    for (const KeyRow* key : keys_of(first.section)) {
        if (key->group == first.group)
            members.push_back(key);
    }
    return members;
}

/// The keys of a sizing request.
std::vector<const KeyRow*> requestOf(const KeyRow& key) {
    std::vector<const KeyRow*> request;
    for (const KeyRow* k : keys_of(key.section)) {
        if (k->parent == key.key)
            request.push_back(k);
    }
    return request;
}

/// A part of the document with the keys it needs at their fallbacks: the required keys of the
/// object (a section, or an object key of it: `parent`) and the first of each group it needs.
Json partWithFallbacks(std::string_view section, std::string_view parent) {
    Json part = Json::object();
    for (const KeyRow* key : keys_of(section)) {
        if (key->parent != parent)
            continue;
        const bool needed = key->group ? key->group->required && membersOf(*key).front() == key
                                       : key->need == KeyNeed::required;
        if (needed && key->fallback)
            part[std::string(key->key)] = *key->fallback;
        // A choice the part needs takes the first of its names (a parachute's type).
        if (needed && key->kind == KeyKind::choice && key->choices)
            part[std::string(key->key)] = std::string(key->choices().front());
    }
    return part;
}

/// A choice's names in the order the form offers them: its display texts' first.
std::vector<std::string_view> offeredNames(const KeyRow& key) {
    std::vector<std::string_view> names;
    for (const ChoiceText& t : key.choice_texts)
        names.push_back(t.name);
    for (const std::string_view name : key.choices()) {
        if (std::find(names.begin(), names.end(), name) == names.end())
            names.push_back(name);
    }
    return names;
}

QString displayText(const KeyRow& key, std::string_view name) {
    for (const ChoiceText& t : key.choice_texts) {
        if (t.name == name)
            return words(t.text);
    }
    return words(name);
}

/// Whether a key belongs to a value of its object's selector (the model or the method).
bool belongsTo(const KeyRow& key, std::string_view name) {
    if (key.model)
        return to_string(*key.model) == name;
    if (key.methods.empty())
        return true;
    return std::any_of(key.methods.begin(), key.methods.end(),
                       [&](TerminalMethod m) { return to_string(m) == name; });
}

}  // namespace

DesignForm::DesignForm(DesignDocument* document, QWidget* parent)
    : QWidget(parent), m_document(document) {
    auto* outer = new QVBoxLayout(this);
    outer->setContentsMargins(0, 0, 0, 0);
    auto* scroll = new QScrollArea(this);
    scroll->setWidgetResizable(true);
    auto* content = new QWidget(scroll);
    m_sections = new QVBoxLayout(content);
    m_documentErrors = new QLabel(content);
    m_documentErrors->setWordWrap(true);
    m_documentErrors->setStyleSheet("color: #a40000;");
    m_documentErrors->setVisible(false);
    m_sections->addWidget(m_documentErrors);
    // Keys a file has that the design does not use would keep it from sizing, and no field
    // shows them: one undoable edit drops them all.
    m_dropUnused = new QPushButton(content);
    m_dropUnused->setObjectName(QStringLiteral("dropUnusedKeys"));
    m_dropUnused->setVisible(false);
    m_sections->addWidget(m_dropUnused, 0, Qt::AlignLeft);
    connect(m_dropUnused, &QPushButton::clicked, this, [this] { m_document->dropUnusedKeys(); });
    scroll->setWidget(content);
    outer->addWidget(scroll);

    for (const FormSection& group : formSections) {
        QFormLayout* form = addSection(tr(group.title));
        for (const std::string_view part : group.parts)
            buildPart(form, *find_section(part));
    }
    m_sections->addStretch(1);
    for (QuantityEdit* edit : findChildren<QuantityEdit*>())
        connect(edit, &QuantityEdit::refusalChanged, this, &DesignForm::refusalsChanged);
    // As wide as its widest row needs, every row shown as it is now: the form then never
    // scrolls sideways (a field cut at the window's side), whatever rows the design shows.
    scroll->setHorizontalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
    setMinimumWidth(content->minimumSizeHint().width() +
                    scroll->verticalScrollBar()->sizeHint().width() + 2 * scroll->frameWidth());

    connect(m_document, &DesignDocument::changed, this, &DesignForm::refresh);
    refresh();
}

QFormLayout* DesignForm::addSection(const QString& title) {
    auto* box = new QGroupBox(title, this);
    auto* form = new QFormLayout(box);
    form->setFieldGrowthPolicy(QFormLayout::AllNonFixedFieldsGrow);
    // A label too long to stand beside its field goes above it, rather than widen the form.
    form->setRowWrapPolicy(QFormLayout::WrapLongRows);
    m_sections->addWidget(box);
    return form;
}

QuantityEdit* DesignForm::addNumber(QFormLayout* form, const KeyRow& key) {
    const std::string pointer = pointerOf(key);
    const QString label = words(label_of(key));
    // An optional key may be emptied; so may the first of a group that may be left out (its
    // default applies).
    const bool optional = key.group ? !key.group->required && membersOf(key).front() == &key
                                    : key.need != KeyNeed::required;
    auto* row = new QWidget(this);
    auto* rowLayout = new QHBoxLayout(row);
    rowLayout->setContentsMargins(0, 0, 0, 0);
    auto* edit = new QuantityEdit(dimensionOfUnit(key.unit), quantityRange(key, {}), row);
    edit->setObjectName(QString::fromStdString(pointer));
    edit->setAccessibleName(label);
    const QString placeholder = optional ? placeholderOf(key) : QString();
    if (!placeholder.isEmpty())
        edit->setPlaceholderText(placeholder);
    rowLayout->addWidget(edit);
    auto* caption = new QLabel(label, this);
    caption->setBuddy(edit);
    form->addRow(caption, row);
    m_numbers.push_back({pointer, edit, optional, row, &key});
    connect(edit, &QuantityEdit::valueEdited, this, [this, pointer, label](double value) {
        if (!m_refreshing)
            m_document->setValue(pointer, value, tr("Set %1").arg(label));
    });
    if (optional) {
        connect(edit, &QLineEdit::editingFinished, this, [this, pointer, edit, label] {
            if (m_refreshing || !edit->text().trimmed().isEmpty())
                return;
            if (!m_document->value(pointer).is_null()) {
                m_document->setValue(pointer, Json(), tr("Clear %1").arg(label));
            } else {
                edit->setValue(std::nullopt);  // already absent: just clear the field's state
            }
        });
    }
    return edit;
}

QComboBox* DesignForm::formCombo() {
    auto* combo = new QComboBox(this);
    guardWheel(combo);
    // As narrow as the form's column allows: the longest choice (a terminal method's) would
    // otherwise widen the whole form past the window's side. The list shows every text whole.
    combo->setSizeAdjustPolicy(QComboBox::AdjustToMinimumContentsLengthWithIcon);
    combo->setMinimumContentsLength(minimumChoiceCharacters);
    return combo;
}

QComboBox* DesignForm::addChoice(QFormLayout* form, const QString& label,
                                 const std::string& pointer,
                                 const std::vector<std::pair<QString, std::string>>& choices) {
    QComboBox* combo = formCombo();
    combo->setObjectName(QString::fromStdString(pointer));
    std::vector<std::string> values;
    for (const auto& [shown, value] : choices) {
        combo->addItem(shown);
        values.push_back(value);
    }
    form->addRow(label, combo);
    m_choices.push_back({pointer, combo, values});
    connect(combo, &QComboBox::currentIndexChanged, this, [this, pointer, values, label](int i) {
        if (m_refreshing || i < 0 || i >= static_cast<int>(values.size()))
            return;
        m_document->setValue(pointer, values[static_cast<std::size_t>(i)], tr("Set %1").arg(label));
    });
    return combo;
}

QComboBox* DesignForm::addShape(QFormLayout* form, const QString& name, const QString& label,
                                const QStringList& shapes, std::function<int()> current,
                                std::function<void(int)> select) {
    QComboBox* combo = formCombo();
    combo->setObjectName(name);
    combo->addItems(shapes);
    form->addRow(label, combo);
    m_shapes.push_back({combo, current, select});
    connect(combo, &QComboBox::currentIndexChanged, this, [this, select](int i) {
        if (!m_refreshing && i >= 0)
            select(i);
    });
    return combo;
}

void DesignForm::buildPart(QFormLayout* form, const SectionRow& section) {
    if (section.name == "body") {
        // A preset by name, or a body of the user's own.
        m_body = new BodyEditor(m_document, form, this);
        return;
    }
    if (section.present)
        addPresence(form, section);
    for (const KeyRow* key : keys_of(section.name)) {
        if (!key->parent.empty())
            continue;  // with their number or their object
        if (key->group) {
            if (membersOf(*key).front() == key)
                addGroup(form, *key);
            continue;
        }
        if (const auto objects = replacements_of(*key);
            !objects.empty() && objects.front()->replaces.front() == key->key) {
            addStart(form, *key);
        }
        switch (key->kind) {
            case KeyKind::number:
            case KeyKind::integer:
                addNumber(form, *key);
                break;
            case KeyKind::number_or_request:
                addNumberOrRequest(form, *key);
                break;
            case KeyKind::object:
                for (const KeyRow* k : keys_of(key->section)) {
                    if (k->parent != key->key)
                        continue;
                    if (!k->group)
                        addNumber(form, *k);
                    else if (membersOf(*k).front() == k)
                        addGroup(form, *k);
                }
                break;
            case KeyKind::choice:
                if (!key->choice_texts.empty()) {
                    addSelector(form, *key);
                } else {
                    std::vector<std::pair<QString, std::string>> choices;
                    for (const std::string_view name : key->choices())
                        choices.emplace_back(words(name), std::string(name));
                    addChoice(form, words(label_of(*key)), pointerOf(*key), choices);
                }
                break;
            case KeyKind::by_hand:
                if (key->path() == "mass.items")
                    buildItems(form);
                else if (key->path() == "atmosphere.wind")
                    addByHand(form, tr("Wind"), *key, new WindTable(m_document, this));
                else if (key->path() == "atmosphere.rows")
                    addByHand(form, tr("Table"), *key, new AtmosphereTable(m_document, this));
                // atmosphere.csv_file: the table shows the file it names.
                break;
            case KeyKind::text:
                break;
        }
    }
}

void DesignForm::addByHand(QFormLayout* form, const QString& label, const KeyRow& key,
                           QWidget* editor) {
    // The form's whole width, under its label: a table of three columns needs more room than
    // the field column has.
    auto* row = new QWidget(this);
    auto* rowLayout = new QVBoxLayout(row);
    rowLayout->setContentsMargins(0, 0, 0, 0);
    rowLayout->setSpacing(2);
    auto* caption = new QLabel(label, row);
    caption->setBuddy(editor);
    rowLayout->addWidget(caption);
    rowLayout->addWidget(editor);
    form->addRow(row);
    m_byHand.push_back({&key, row});
}

void DesignForm::addPresence(QFormLayout* form, const SectionRow& section) {
    const std::string pointer = pointerOf(section);
    const QString label = words(section.label);
    addShape(
        form, QString::fromStdString(pointer) + "#presence", label,
        {words(section.absent_text), words(section.present_text)},
        [this, pointer] { return m_document->value(pointer).is_object() ? 1 : 0; },
        [this, pointer, label, &section](int shape) {
            const bool present = m_document->value(pointer).is_object();
            if (shape == 1 && !present) {
                m_document->setValue(pointer, partWithFallbacks(section.name, {}),
                                     tr("Add the %1").arg(label.toLower()));
            } else if (shape == 0 && present) {
                m_document->setValue(pointer, Json(), tr("Remove the %1").arg(label.toLower()));
            }
        });
}

void DesignForm::addStart(QFormLayout* form, const KeyRow& first) {
    const std::vector<const KeyRow*> objects = replacements_of(first);
    std::vector<std::string> replaced;
    for (const std::string_view key : objects.front()->replaces)
        replaced.push_back(
            pointerOf(*find_key(std::string(first.section) + "." + std::string(key))));
    QStringList shapes{words(first.shape_text)};
    for (const KeyRow* object : objects)
        shapes << words(object->shape_text);
    const std::string frame = key_to_pointer(std::string(first.section) + ".velocity_frame");
    addShape(
        form, QString::fromStdString(key_to_pointer(first.section)) + "#start", tr("Entry state"),
        shapes,
        [this, objects] {
            for (std::size_t i = 0; i < objects.size(); ++i) {
                if (m_document->value(pointerOf(*objects[i])).is_object())
                    return static_cast<int>(i + 1);
            }
            return 0;
        },
        [this, objects, replaced, frame](int shape) {
            std::vector<std::pair<std::string, Json>> values;
            for (std::size_t i = 0; i < objects.size(); ++i) {
                const std::string pointer = pointerOf(*objects[i]);
                const bool chosen = static_cast<int>(i + 1) == shape;
                const bool present = m_document->value(pointer).is_object();
                if (!chosen && present)
                    values.emplace_back(pointer, Json());
                if (chosen && !present)
                    values.emplace_back(pointer,
                                        partWithFallbacks(objects[i]->section, objects[i]->key));
            }
            for (const std::string& pointer : replaced) {
                const bool there = !m_document->value(pointer).is_null();
                const KeyRow* key = find_key(pointer_to_key(pointer));
                if (shape != 0 && there)
                    values.emplace_back(pointer, Json());
                if (shape == 0 && !there && key->fallback)
                    values.emplace_back(pointer, *key->fallback);
            }
            // A conic gives the inertial state: the frame it is read in (the key left out).
            if (shape != 0 && !m_document->value(frame).is_null())
                values.emplace_back(frame, Json());
            if (!values.empty())
                m_document->setValues(values, tr("Change where the entry starts"));
        });
}

void DesignForm::addSelector(QFormLayout* form, const KeyRow& selector) {
    const std::string pointer = pointerOf(selector);
    const std::vector<std::string_view> names = offeredNames(selector);
    QStringList shapes;
    for (const std::string_view name : names)
        shapes << displayText(selector, name);
    addShape(
        form, QString::fromStdString(pointer), words(label_of(selector)), shapes,
        [this, pointer, names] {
            const Json now = m_document->value(pointer);
            for (std::size_t i = 0; i < names.size(); ++i) {
                if (now == names[i])
                    return static_cast<int>(i);
            }
            return 0;
        },
        [this, pointer, names, &selector](int shape) {
            const std::string_view name = names[static_cast<std::size_t>(shape)];
            const std::vector<const KeyRow*> keys = keys_of(selector.section);
            std::vector<std::pair<std::string, Json>> values{{pointer, std::string(name)}};
            // A table atmosphere starts as the atmosphere the design has, in rows to edit.
            if (name == to_string(AtmosphereModel::table) &&
                m_document->value("/atmosphere/rows").is_null() &&
                m_document->value("/atmosphere/csv_file").is_null()) {
                values.emplace_back("/atmosphere/rows", AtmosphereTable::startingRows(*m_document));
            }
            for (const KeyRow* key : keys) {
                if (key == &selector || !key->parent.empty())
                    continue;
                const std::string at = pointerOf(*key);
                // Of a group only its first key is filled in: one trigger, not every one.
                const bool wanted =
                    belongsTo(*key, name) && (!key->group || membersOf(*key).front() == key);
                const bool there = !m_document->value(at).is_null();
                const bool canopy = key->on_canopy && name == to_string(TerminalMethod::none);
                const std::optional<double> fallback =
                    canopy ? key->on_canopy->fallback : key->fallback;
                if (!wanted && there)
                    values.emplace_back(at, Json());
                if (wanted && !there && fallback)
                    values.emplace_back(at, *fallback);
            }
            // A powered descent from the entry flies without canopies; the other engines fire
            // under a parachute: the sections follow the method in the same edit.
            if (selector.path() == "terminal.method") {
                const bool powered = name == to_string(TerminalMethod::supersonic_retro);
                const bool none = name == to_string(TerminalMethod::none);
                for (const char* canopy : {"/parachute", "/drogue"}) {
                    if (powered && m_document->value(canopy).is_object())
                        values.emplace_back(canopy, Json());
                }
                if (!powered && !none && !m_document->value("/parachute").is_object())
                    values.emplace_back("/parachute", partWithFallbacks("parachute", {}));
            }
            m_document->setValues(
                values,
                tr("Change the %1 %2").arg(fromView(selector.section), fromView(selector.key)));
        });
}

void DesignForm::addGroup(QFormLayout* form, const KeyRow& first) {
    const std::vector<const KeyRow*> members = membersOf(first);
    QStringList shapes;
    for (const KeyRow* key : members)
        shapes << words(key->shape_text);
    const KeyGroup* group = first.group;
    addShape(
        form, QString::fromStdString(key_to_pointer(first.section)) + "#" + fromView(group->name),
        words(group->label), shapes,
        [this, members] {
            for (std::size_t i = 0; i < members.size(); ++i) {
                if (!m_document->value(pointerOf(*members[i])).is_null())
                    return static_cast<int>(i);
            }
            return 0;
        },
        [this, members, group](int shape) {
            std::vector<std::pair<std::string, Json>> values;
            for (std::size_t i = 0; i < members.size(); ++i) {
                const std::string pointer = pointerOf(*members[i]);
                const bool chosen = static_cast<int>(i) == shape;
                const Json now = m_document->value(pointer);
                if (!chosen && !now.is_null())
                    values.emplace_back(pointer, Json());
                if (chosen && now.is_null() && members[i]->fallback) {
                    values.emplace_back(pointer, *members[i]->fallback);
                }
            }
            if (!values.empty())
                m_document->setValues(values, tr("Change the %1").arg(fromView(group->name)));
        });
    m_shapes.back().part = &first;
    for (const KeyRow* key : members)
        addNumber(form, *key);
}

void DesignForm::addNumberOrRequest(QFormLayout* form, const KeyRow& key) {
    const std::string pointer = pointerOf(key);
    const std::vector<const KeyRow*> request = requestOf(key);
    addShape(
        form, QString::fromStdString(pointer) + "#sizing", words(label_of(key)),
        {words(key.shape_text), words(request.front()->shape_text)},
        [this, pointer] { return m_document->value(pointer).is_object() ? 1 : 0; },
        [this, pointer, request, &key](int shape) {
            const Json now = m_document->value(pointer);
            if (shape == 1 && !now.is_object()) {
                Json sizing = Json::object();
                for (const KeyRow* k : request) {
                    if (k->fallback)
                        sizing[std::string(k->key)] = *k->fallback;
                }
                m_document->setValue(pointer, sizing, tr("Size the %1").arg(fromView(key.section)));
            } else if (shape == 0 && now.is_object() && key.fallback) {
                m_document->setValue(
                    pointer, *key.fallback,
                    tr("Give the %1 %2").arg(fromView(key.section), fromView(key.key)));
            }
        });
    m_shapes.back().part = &key;  // shown with its part (a parachute the design may lack)
    addNumber(form, key);
    for (const KeyRow* k : request)
        addNumber(form, *k);
}

void DesignForm::buildItems(QFormLayout* form) {
    m_items = new QTableWidget(0, 4, this);
    m_items->setObjectName("/mass/items");
    m_items->setHorizontalHeaderLabels(
        {tr("Item"), tr("Basic mass (kg)"), tr("Group"), tr("Maturity")});
    m_items->horizontalHeader()->setSectionResizeMode(0, QHeaderView::Stretch);
    m_items->verticalHeader()->setVisible(false);
    m_items->setMinimumHeight(140);
    form->addRow(m_items);
    auto* buttons = new QWidget(this);
    auto* buttonRow = new QHBoxLayout(buttons);
    buttonRow->setContentsMargins(0, 0, 0, 0);
    auto* add = new QPushButton(tr("Add item"), buttons);
    auto* remove = new QPushButton(tr("Remove item"), buttons);
    buttonRow->addWidget(add);
    buttonRow->addWidget(remove);
    buttonRow->addStretch(1);
    form->addRow(buttons);
    connect(add, &QPushButton::clicked, this, [this] {
        Json items = m_document->value("/mass/items");
        if (!items.is_array())
            items = Json::array();
        items.push_back({{"name", "new item"},
                         {"mass_kg", 10.0},
                         {"group", to_string(MassGroup::payload)},
                         {"maturity", to_string(Maturity::estimated)}});
        m_document->setValue("/mass/items", items, tr("Add a mass item"));
    });
    connect(remove, &QPushButton::clicked, this, [this] {
        const int row = m_items->currentRow();
        Json items = m_document->value("/mass/items");
        if (row < 0 || !items.is_array() || row >= static_cast<int>(items.size()))
            return;
        items.erase(static_cast<std::size_t>(row));
        m_document->setValue("/mass/items", items, tr("Remove a mass item"));
    });
    connect(m_items, &QTableWidget::cellChanged, this, [this] {
        if (!m_refreshing)
            writeItems();
    });
}

bool DesignForm::partPresent(const KeyRow& key) const {
    if (const SectionRow* section = find_section(key.section); section && section->present) {
        if (!m_document->value(pointerOf(*section)).is_object())
            return false;
    }
    if (!key.parent.empty()) {
        return m_document
            ->value(key_to_pointer(std::string(key.section) + "." + std::string(key.parent)))
            .is_object();
    }
    return true;
}

bool DesignForm::applies(const KeyRow& key) const {
    const auto present = [&](const KeyRow& k) {
        return !m_document->value(pointerOf(k)).is_null();
    };
    if (!partPresent(key))
        return false;
    if (key.model) {
        const Json model = m_document->value("/atmosphere/model");
        if (!model.is_string() || !belongsTo(key, model.get<std::string>()))
            return false;
    }
    if (!key.methods.empty()) {
        const Json method = m_document->value("/terminal/method");
        if (!method.is_string() || !belongsTo(key, method.get<std::string>()))
            return false;
    }
    if (key.group) {
        if (present(key))
            return true;
        // The first of a group that may be left out stands for its default.
        const std::vector<const KeyRow*> members = membersOf(key);
        const bool none = std::none_of(members.begin(), members.end(),
                                       [&](const KeyRow* k) { return present(*k); });
        return !key.group->required && none && members.front() == &key;
    }
    if (key.kind == KeyKind::number_or_request)
        return !m_document->value(pointerOf(key)).is_object();
    for (const KeyRow* object : replacements_of(key)) {
        if (m_document->value(pointerOf(*object)).is_object())
            return false;
    }
    return true;
}

void DesignForm::refresh() {
    m_refreshing = true;
    const std::vector<ReadError>& errors = m_document->errors();
    // Typical values follow the body (an Earth entry is faster than a Mars one).
    const Json bodyValue = m_document->value("/body");
    const std::string body = bodyValue.is_string() ? bodyValue.get<std::string>() : std::string();
    for (NumberBinding& b : m_numbers) {
        b.edit->setRange(quantityRange(*b.key, body));
        const Json v = m_document->value(b.pointer);
        b.edit->setValue(v.is_number() ? std::optional<double>(v.get<double>()) : std::nullopt);
        b.edit->setExternalError({});
    }
    for (ChoiceBinding& c : m_choices) {
        const QSignalBlocker block(c.combo);
        const Json v = m_document->value(c.pointer);
        int index = -1;
        for (std::size_t i = 0; i < c.values.size(); ++i) {
            if (v == c.values[i])
                index = static_cast<int>(i);
        }
        c.combo->setCurrentIndex(index);
    }
    for (ShapeBinding& s : m_shapes) {
        const QSignalBlocker block(s.combo);
        s.combo->setCurrentIndex(s.current());
    }

    // Show the rows the document's shape has.
    for (NumberBinding& b : m_numbers)
        setRowVisible(b.pointer, applies(*b.key));
    for (ShapeBinding& s : m_shapes) {
        if (s.part)
            setFieldVisible(s.combo, partPresent(*s.part));
    }
    for (const auto& [key, editor] : m_byHand)
        setFieldVisible(editor, applies(*key));
    // The choices of a part the design lacks (a parachute's type) show with the part.
    for (ChoiceBinding& c : m_choices) {
        if (const KeyRow* key = find_key(pointer_to_key(c.pointer)))
            setFieldVisible(c.combo, partPresent(*key));
    }
    refreshItems();

    // Errors of the reader at their fields; the rest above the forms.
    QStringList unplaced;
    for (const ReadError& error : errors) {
        bool placed = false;
        for (NumberBinding& b : m_numbers) {
            if (pointer_to_key(b.pointer) == error.path && b.row->isVisibleTo(this)) {
                b.edit->setExternalError(QString::fromStdString(error.message));
                placed = true;
            }
        }
        if (!placed)
            unplaced << QString::fromStdString(error.text());
    }
    m_documentErrors->setText(tr("The design cannot be sized yet:\n%1").arg(unplaced.join('\n')));
    m_documentErrors->setVisible(!unplaced.isEmpty());
    const QStringList unused = m_document->unusedKeys();
    m_dropUnused->setText(unused.size() == 1
                              ? tr("Drop the key the design does not use")
                              : tr("Drop the %1 keys the design does not use").arg(unused.size()));
    m_dropUnused->setToolTip(tr("Removes %1 from the design, as one edit that Undo restores.")
                                 .arg(unused.join(QStringLiteral(", "))));
    m_dropUnused->setVisible(!unused.isEmpty());
    m_refreshing = false;
}

void DesignForm::refreshItems() {
    const QSignalBlocker block(m_items);
    const Json items = m_document->value("/mass/items");
    const int rows = items.is_array() ? static_cast<int>(items.size()) : 0;
    m_items->setRowCount(rows);
    for (int row = 0; row < rows; ++row) {
        const Json& item = items[static_cast<std::size_t>(row)];
        const auto text = [&](const char* key) {
            const Json v = item.value(key, Json());
            if (v.is_string())
                return QString::fromStdString(v.get<std::string>());
            if (v.is_number())
                return QString::fromStdString(formatQuantity(v.get<double>()));
            return QString();
        };
        m_items->setItem(row, 0, new QTableWidgetItem(text("name")));
        m_items->setItem(row, 1, new QTableWidgetItem(text("mass_kg")));
        auto* group = new QComboBox(m_items);
        guardWheel(group);
        for (const std::string_view name : enum_names<MassGroup>())
            group->addItem(fromView(name));
        group->setCurrentText(text("group"));
        auto* maturity = new QComboBox(m_items);
        guardWheel(maturity);
        for (const std::string_view name : enum_names<Maturity>())
            maturity->addItem(fromView(name));
        maturity->setCurrentText(text("maturity").isEmpty()
                                     ? fromView(to_string(Maturity::estimated))
                                     : text("maturity"));
        m_items->setCellWidget(row, 2, group);
        m_items->setCellWidget(row, 3, maturity);
        connect(group, &QComboBox::currentIndexChanged, this, [this] {
            if (!m_refreshing)
                writeItems();
        });
        connect(maturity, &QComboBox::currentIndexChanged, this, [this] {
            if (!m_refreshing)
                writeItems();
        });
    }
}

void DesignForm::writeItems() {
    Json items = Json::array();
    for (int row = 0; row < m_items->rowCount(); ++row) {
        const auto cell = [&](int column) {
            const QTableWidgetItem* item = m_items->item(row, column);
            return item ? item->text().trimmed() : QString();
        };
        Json item;
        item["name"] = cell(0).toStdString();
        // The mass goes through the same parser as every number field: "300 lbm" works.
        const ParsedQuantity mass = parseQuantity(cell(1).toStdString(), Dimension::mass);
        item["mass_kg"] = mass.value ? Json(*mass.value) : Json(cell(1).toStdString());
        item["group"] =
            static_cast<QComboBox*>(m_items->cellWidget(row, 2))->currentText().toStdString();
        item["maturity"] =
            static_cast<QComboBox*>(m_items->cellWidget(row, 3))->currentText().toStdString();
        items.push_back(item);
    }
    m_document->setValue("/mass/items", items, tr("Edit the mass items"));
}

void DesignForm::setRowVisible(const std::string& pointer, bool visible) {
    for (NumberBinding& b : m_numbers) {
        if (b.pointer == pointer)
            setFieldVisible(b.row, visible);
    }
}

void DesignForm::setFieldVisible(QWidget* field, bool visible) {
    field->setVisible(visible);
    if (auto* form = qobject_cast<QFormLayout*>(field->parentWidget()->layout())) {
        if (QWidget* label = form->labelForField(field))
            label->setVisible(visible);
    }
}

QStringList DesignForm::refusedFields() const {
    // Every number field of the form, the body's and the schema rows' alike.
    QStringList refused;
    for (const QuantityEdit* edit : findChildren<QuantityEdit*>()) {
        if (edit->isRefused())
            refused << tr("%1: %2").arg(edit->accessibleName(), edit->errorText());
    }
    return refused;
}

QWidget* DesignForm::fieldFor(const std::string& pointer) const {
    for (const NumberBinding& b : m_numbers) {
        if (b.pointer == pointer)
            return b.edit;
    }
    for (const ChoiceBinding& c : m_choices) {
        if (c.pointer == pointer)
            return c.combo;
    }
    if (pointer == "/mass/items")
        return m_items;
    if (pointer == "/body")
        return m_body->choice();
    if (pointer.rfind("/body/", 0) == 0)
        return m_body->fieldFor(pointer.substr(6));
    return nullptr;
}

bool DesignForm::focusField(const std::string& pointer) {
    QWidget* field = fieldFor(pointer);
    if (field && !field->isVisibleTo(this)) {
        // A key of a group the document gives another of (a check names the Mach trigger, the
        // design deploys on dynamic pressure): the one it gives.
        const KeyRow* key = find_key(pointer_to_key(pointer));
        for (const NumberBinding& b : m_numbers) {
            if (key && key->group && b.key->group == key->group && b.key->section == key->section &&
                b.edit->isVisibleTo(this)) {
                field = b.edit;
            }
        }
    }
    if (!field || !field->isVisibleTo(this))
        return false;
    for (QWidget* w = field->parentWidget(); w; w = w->parentWidget()) {
        if (auto* scroll = qobject_cast<QScrollArea*>(w)) {
            scroll->ensureWidgetVisible(field);
            break;
        }
    }
    field->setFocus(Qt::OtherFocusReason);
    if (auto* edit = qobject_cast<QLineEdit*>(field))
        edit->selectAll();
    return true;
}

}  // namespace ds
