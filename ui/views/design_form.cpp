#include "views/design_form.hpp"

#include <QComboBox>
#include <QFormLayout>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QPushButton>
#include <QScrollArea>
#include <QSignalBlocker>
#include <QTableWidget>
#include <QVBoxLayout>

#include "checks/limits.hpp"
#include "design/design.hpp"
#include "model/design_document.hpp"

namespace ds {
namespace {

using Json = DesignDocument::Json;

QuantityRange positive(double low, double high) { return {0.0, std::nullopt, true, false, low, high}; }
QuantityRange atLeastZero(double low, double high) { return {0.0, std::nullopt, false, false, low, high}; }
QuantityRange between(double min, double max, double low, double high) {
    return {min, max, false, false, low, high};
}
QuantityRange anyValue(double low, double high) { return {std::nullopt, std::nullopt, false, false, low, high}; }

// The deploy trigger keys of the parachute and the decelerator, in the order of the shape combo.
const std::vector<std::string> trigger_keys{"deploy_mach", "deploy_dynamic_pressure_Pa",
                                            "deploy_altitude_m"};
const std::vector<Json> trigger_defaults{1.8, 500.0, 10000.0};

// Terminal keys that only some methods take.
const std::vector<std::string> engine_keys{"isp_s", "thrust_to_weight", "throttle",
                                           "propellant_reserve_fraction",
                                           "propellant_residual_fraction", "thrust_N",
                                           "propellant_loaded_kg"};

Dimension dimensionOfUnit(std::string_view unit) {
    if (unit == "kg/m^2") return Dimension::area_density;
    if (unit == "m") return Dimension::length;
    if (unit == "deg") return Dimension::angle;
    if (unit == "Pa") return Dimension::pressure;
    if (unit == "g") return Dimension::acceleration;
    if (unit == "W/cm^2") return Dimension::heat_flux;
    if (unit == "kg") return Dimension::mass;
    if (unit == "m/s") return Dimension::velocity;
    if (unit == "s") return Dimension::time;
    return Dimension::dimensionless;
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
    scroll->setWidget(content);
    outer->addWidget(scroll);

    buildBodyAndSite();
    buildEntry();
    buildAeroshell();
    buildDragDevices();
    buildTerminal();
    buildSequence();
    buildMass();
    buildLimits();
    m_sections->addStretch(1);

    connect(m_document, &DesignDocument::changed, this, &DesignForm::refresh);
    refresh();
}

QFormLayout* DesignForm::addSection(const QString& title) {
    auto* box = new QGroupBox(title, this);
    auto* form = new QFormLayout(box);
    form->setFieldGrowthPolicy(QFormLayout::AllNonFixedFieldsGrow);
    m_sections->addWidget(box);
    return form;
}

QuantityEdit* DesignForm::addNumber(QFormLayout* form, const QString& label,
                                    const std::string& pointer, Dimension dimension,
                                    QuantityRange range, bool optional, const QString& placeholder) {
    auto* row = new QWidget(this);
    auto* rowLayout = new QHBoxLayout(row);
    rowLayout->setContentsMargins(0, 0, 0, 0);
    auto* edit = new QuantityEdit(dimension, range, row);
    edit->setObjectName(QString::fromStdString(pointer));
    if (!placeholder.isEmpty()) edit->setPlaceholderText(placeholder);
    rowLayout->addWidget(edit);
    auto* caption = new QLabel(label, this);
    caption->setBuddy(edit);
    form->addRow(caption, row);
    m_numbers.push_back({pointer, edit, optional, row});
    connect(edit, &QuantityEdit::valueEdited, this, [this, pointer, label](double value) {
        if (!m_refreshing) m_document->setValue(pointer, value, tr("Set %1").arg(label));
    });
    if (optional) {
        connect(edit, &QLineEdit::editingFinished, this, [this, pointer, edit, label] {
            if (m_refreshing || !edit->text().trimmed().isEmpty()) return;
            if (!m_document->value(pointer).is_null()) {
                m_document->setValue(pointer, Json(), tr("Clear %1").arg(label));
            } else {
                edit->setValue(std::nullopt);  // already absent: just clear the field's state
            }
        });
    }
    return edit;
}

QComboBox* DesignForm::addChoice(QFormLayout* form, const QString& label,
                                 const std::string& pointer,
                                 const std::vector<std::pair<QString, std::string>>& choices) {
    auto* combo = new QComboBox(this);
    combo->setObjectName(QString::fromStdString(pointer));
    std::vector<std::string> values;
    for (const auto& [text, value] : choices) {
        combo->addItem(text);
        values.push_back(value);
    }
    form->addRow(label, combo);
    m_choices.push_back({pointer, combo, values});
    connect(combo, &QComboBox::currentIndexChanged, this, [this, pointer, values, label](int i) {
        if (m_refreshing || i < 0 || i >= static_cast<int>(values.size())) return;
        m_document->setValue(pointer, values[static_cast<std::size_t>(i)], tr("Set %1").arg(label));
    });
    return combo;
}

QComboBox* DesignForm::addShape(QFormLayout* form, const QString& label, const QStringList& shapes,
                                std::function<int()> current, std::function<void(int)> select) {
    auto* combo = new QComboBox(this);
    combo->addItems(shapes);
    form->addRow(label, combo);
    m_shapes.push_back({combo, current, select});
    connect(combo, &QComboBox::currentIndexChanged, this, [this, select](int i) {
        if (!m_refreshing && i >= 0) select(i);
    });
    return combo;
}

void DesignForm::addTrigger(QFormLayout* form, const std::string& object) {
    addShape(
        form, tr("Deploy when"), {tr("Mach falls to"), tr("dynamic pressure falls to"), tr("altitude falls to")},
        [this, object] {
            for (std::size_t i = 0; i < trigger_keys.size(); ++i) {
                if (!m_document->value(object + "/" + trigger_keys[i]).is_null()) {
                    return static_cast<int>(i);
                }
            }
            return 0;
        },
        [this, object](int shape) {
            std::vector<std::pair<std::string, Json>> values;
            for (std::size_t i = 0; i < trigger_keys.size(); ++i) {
                const std::string pointer = object + "/" + trigger_keys[i];
                const bool chosen = static_cast<int>(i) == shape;
                const Json now = m_document->value(pointer);
                if (chosen && now.is_null()) values.emplace_back(pointer, trigger_defaults[i]);
                if (!chosen && !now.is_null()) values.emplace_back(pointer, Json());
            }
            if (!values.empty()) m_document->setValues(values, tr("Change the deploy trigger"));
        });
    addNumber(form, tr("Deploy Mach"), object + "/deploy_mach", Dimension::dimensionless,
              positive(1.4, 2.1), false);
    addNumber(form, tr("Deploy dynamic pressure"), object + "/deploy_dynamic_pressure_Pa",
              Dimension::pressure, positive(250, 850), false);
    addNumber(form, tr("Deploy altitude"), object + "/deploy_altitude_m", Dimension::length,
              anyValue(5000, 15000), false);
}

void DesignForm::buildBodyAndSite() {
    QFormLayout* form = addSection(tr("Body and landing site"));
    addChoice(form, tr("Body"), "/body",
              {{tr("Mars"), "mars"}, {tr("Earth"), "earth"}, {tr("Venus"), "venus"}, {tr("Titan"), "titan"}});
    addNumber(form, tr("Site elevation"), "/site/elevation_m", Dimension::length,
              anyValue(-4000, 0), false);
    addShape(
        form, tr("Atmosphere"), {tr("exponential"), tr("the body's standard model"), tr("table (edit in the file)")},
        [this] {
            const Json model = m_document->value("/atmosphere/model");
            if (model == "standard") return 1;
            if (model == "table") return 2;
            return 0;
        },
        [this](int shape) {
            if (shape == 2) return;  // a table comes from a file or the document
            std::vector<std::pair<std::string, Json>> values;
            const std::vector<std::pair<std::string, Json>> exponential{
                {"/atmosphere/surface_density_kg_m3", 0.020},
                {"/atmosphere/scale_height_m", 11100.0},
                {"/atmosphere/temperature_K", 210.0}};
            values.emplace_back("/atmosphere/model", shape == 0 ? "exponential" : "standard");
            for (const auto& [pointer, fallback] : exponential) {
                const Json now = m_document->value(pointer);
                if (shape == 0 && now.is_null()) values.emplace_back(pointer, fallback);
                if (shape == 1 && !now.is_null()) values.emplace_back(pointer, Json());
            }
            values.emplace_back("/atmosphere/rows", Json());
            values.emplace_back("/atmosphere/csv_file", Json());
            m_document->setValues(values, tr("Change the atmosphere model"));
        });
    addNumber(form, tr("Surface density"), "/atmosphere/surface_density_kg_m3", Dimension::density,
              positive(0.010, 0.025), false);
    addNumber(form, tr("Scale height"), "/atmosphere/scale_height_m", Dimension::length,
              positive(7000, 12000), false);
    addNumber(form, tr("Temperature"), "/atmosphere/temperature_K", Dimension::temperature,
              positive(150, 300), false);
    addNumber(form, tr("Density scale"), "/atmosphere/density_scale", Dimension::dimensionless,
              positive(0.8, 1.2), true, "1");
}

void DesignForm::buildEntry() {
    QFormLayout* form = addSection(tr("Entry state"));
    addNumber(form, tr("Interface altitude"), "/entry/interface_altitude_m", Dimension::length,
              positive(120000, 130000), false);
    addNumber(form, tr("Velocity"), "/entry/velocity_m_s", Dimension::velocity,
              positive(4500, 7500), false);
    addNumber(form, tr("Flight-path angle"), "/entry/flight_path_angle_deg", Dimension::angle,
              {-90.0, 90.0, true, true, -18, -10}, false);
    addNumber(form, tr("Lift-to-drag ratio"), "/entry/lift_to_drag", Dimension::dimensionless,
              {0.0, 5.0, false, true, 0, 0.3}, true, "0");
    addNumber(form, tr("Bank angle"), "/entry/bank_angle_deg", Dimension::angle,
              between(-180, 180, 0, 90), true, "0");
}

void DesignForm::buildAeroshell() {
    QFormLayout* form = addSection(tr("Aeroshell"));
    addShape(
        form, tr("Diameter"), {tr("given"), tr("sized for a ballistic coefficient")},
        [this] { return m_document->value("/aeroshell/diameter_m").is_object() ? 1 : 0; },
        [this](int shape) {
            const Json now = m_document->value("/aeroshell/diameter_m");
            if (shape == 1 && !now.is_object()) {
                m_document->setValue("/aeroshell/diameter_m",
                                     Json{{"size_for_ballistic_coefficient_kg_m2", 100.0}},
                                     tr("Size the aeroshell"));
            } else if (shape == 0 && now.is_object()) {
                m_document->setValue("/aeroshell/diameter_m", 2.6, tr("Give the aeroshell diameter"));
            }
        });
    addNumber(form, tr("Diameter"), "/aeroshell/diameter_m", Dimension::length,
              positive(2.0, 4.6), false);
    addNumber(form, tr("Target ballistic coefficient"),
              "/aeroshell/diameter_m/size_for_ballistic_coefficient_kg_m2",
              Dimension::area_density, positive(50, 150), false);
    addNumber(form, tr("Cone half-angle"), "/aeroshell/half_angle_deg", Dimension::angle,
              {0.0, 90.0, true, true, 45, 70}, true, "70");
    addNumber(form, tr("Nose radius"), "/aeroshell/nose_radius_m", Dimension::length,
              positive(0.3, 1.2), false);
    addNumber(form, tr("Drag coefficient"), "/aeroshell/drag_coefficient", Dimension::dimensionless,
              positive(1.5, 1.7), true, tr("modified Newtonian"));
}

void DesignForm::buildDragDevices() {
    QFormLayout* form = addSection(tr("Drag devices"));
    addChoice(form, tr("Parachute type"), "/parachute/type",
              {{tr("disk-gap-band"), "disk-gap-band"}, {tr("ringsail"), "ringsail"}});
    addShape(
        form, tr("Parachute diameter"), {tr("given"), tr("sized for a descent speed")},
        [this] { return m_document->value("/parachute/diameter_m").is_object() ? 1 : 0; },
        [this](int shape) {
            const Json now = m_document->value("/parachute/diameter_m");
            if (shape == 1 && !now.is_object()) {
                m_document->setValue("/parachute/diameter_m",
                                     Json{{"size_for_velocity_m_s", 70.0},
                                          {"at_height_above_site_m", 2000.0}},
                                     tr("Size the parachute"));
            } else if (shape == 0 && now.is_object()) {
                m_document->setValue("/parachute/diameter_m", 12.0, tr("Give the parachute diameter"));
            }
        });
    addNumber(form, tr("Nominal diameter"), "/parachute/diameter_m", Dimension::length,
              positive(10, 30), false);
    addNumber(form, tr("Descent speed wanted"), "/parachute/diameter_m/size_for_velocity_m_s",
              Dimension::velocity, positive(50, 90), false);
    addNumber(form, tr("  at height above the site"),
              "/parachute/diameter_m/at_height_above_site_m", Dimension::length,
              atLeastZero(1000, 3000), false);
    addNumber(form, tr("Parachute drag coefficient"), "/parachute/drag_coefficient",
              Dimension::dimensionless, positive(0.5, 0.9), true, tr("the type's nominal value"));
    addTrigger(form, "/parachute");
    addNumber(form, tr("Parachute mass"), "/parachute/mass_kg", Dimension::mass,
              positive(10, 80), true, tr("estimated"));

    addShape(
        form, tr("Inflatable decelerator"), {tr("none"), tr("before the parachute")},
        [this] { return m_document->value("/decelerator").is_object() ? 1 : 0; },
        [this](int shape) {
            const bool present = m_document->value("/decelerator").is_object();
            if (shape == 1 && !present) {
                m_document->setValue("/decelerator",
                                     Json{{"diameter_m", 6.0}, {"drag_coefficient", 1.3},
                                          {"deploy_mach", 3.0}},
                                     tr("Add an inflatable decelerator"));
            } else if (shape == 0 && present) {
                m_document->setValue("/decelerator", Json(), tr("Remove the inflatable decelerator"));
            }
        });
    addNumber(form, tr("Decelerator diameter"), "/decelerator/diameter_m", Dimension::length,
              positive(5, 12), false);
    addNumber(form, tr("Decelerator drag coefficient"), "/decelerator/drag_coefficient",
              Dimension::dimensionless, positive(1.0, 1.5), false);
    addNumber(form, tr("Decelerator deploy Mach"), "/decelerator/deploy_mach",
              Dimension::dimensionless, positive(2.5, 4.0), false);
    addNumber(form, tr("Decelerator mass"), "/decelerator/mass_kg", Dimension::mass,
              positive(20, 150), true, tr("estimated"));
}

void DesignForm::buildTerminal() {
    QFormLayout* form = addSection(tr("Terminal descent"));
    const std::vector<std::string> methods{"retro", "airbag", "tethered", "none"};
    addShape(
        form, tr("Method"), {tr("retro-rockets to touchdown"), tr("airbags"), tr("tethered lowering"), tr("none (land on the canopy)")},
        [this, methods] {
            const Json method = m_document->value("/terminal/method");
            for (std::size_t i = 0; i < methods.size(); ++i) {
                if (method == methods[i]) return static_cast<int>(i);
            }
            return 0;
        },
        [this, methods](int shape) {
            const std::string method = methods[static_cast<std::size_t>(shape)];
            std::vector<std::pair<std::string, Json>> values{{"/terminal/method", method}};
            const auto keep = [&](const std::string& key, bool wanted, const Json& fallback) {
                const std::string pointer = "/terminal/" + key;
                const Json now = m_document->value(pointer);
                if (!wanted && !now.is_null()) values.emplace_back(pointer, Json());
                if (wanted && now.is_null() && !fallback.is_null()) values.emplace_back(pointer, fallback);
            };
            const bool engines = method != "none";
            keep("isp_s", engines, 220.0);
            keep("thrust_to_weight", engines, 2.5);
            keep("touchdown_velocity_m_s", true, engines ? 2.0 : 8.0);
            for (const char* key : {"throttle", "propellant_reserve_fraction",
                                    "propellant_residual_fraction", "thrust_N",
                                    "propellant_loaded_kg"}) {
                keep(key, engines, Json());
            }
            keep("release_height_m", method == "airbag", Json());
            keep("tether_length_m", method == "tethered", Json());
            keep("fly_away_s", method == "tethered", Json());
            m_document->setValues(values, tr("Change the terminal method"));
        });
    addNumber(form, tr("Specific impulse"), "/terminal/isp_s", Dimension::time,
              positive(210, 325), false);
    addNumber(form, tr("Thrust-to-weight"), "/terminal/thrust_to_weight", Dimension::dimensionless,
              {1.0, std::nullopt, true, false, 1.5, 3.0}, false);
    addNumber(form, tr("End-of-burn speed"), "/terminal/touchdown_velocity_m_s", Dimension::velocity,
              atLeastZero(0.5, 3.0), false);
    addNumber(form, tr("Throttle"), "/terminal/throttle", Dimension::dimensionless,
              {0.0, 1.0, true, false, 0.6, 1.0}, true, "1");
    addNumber(form, tr("Propellant reserve"), "/terminal/propellant_reserve_fraction",
              Dimension::dimensionless, {0.0, 1.0, false, true, 0.05, 0.15}, true, "0.1");
    addNumber(form, tr("Propellant residual"), "/terminal/propellant_residual_fraction",
              Dimension::dimensionless, {0.0, 1.0, false, true, 0.02, 0.05}, true, "0.03");
    addNumber(form, tr("Full thrust (built)"), "/terminal/thrust_N", Dimension::force,
              positive(2000, 20000), true, "from thrust-to-weight");
    addNumber(form, tr("Propellant loaded (built)"), "/terminal/propellant_loaded_kg",
              Dimension::mass, positive(20, 300), true, "from the burn");
    addNumber(form, tr("Release height"), "/terminal/release_height_m", Dimension::length,
              atLeastZero(10, 20), true, "12 m");
    addNumber(form, tr("Tether length"), "/terminal/tether_length_m", Dimension::length,
              positive(6, 10), true, "7.5 m");
    addNumber(form, tr("Fly-away time"), "/terminal/fly_away_s", Dimension::time,
              atLeastZero(5, 15), true, "10 s");
}

void DesignForm::buildSequence() {
    QFormLayout* form = addSection(tr("Sequence after deploy"));
    addShape(
        form, tr("Heat-shield jettison"), {tr("after a delay"), tr("when dynamic pressure falls to")},
        [this] {
            return m_document->value("/sequence/heat_shield_jettison_dynamic_pressure_Pa").is_null() ? 0 : 1;
        },
        [this](int shape) {
            const std::string delay = "/sequence/heat_shield_jettison_delay_s";
            const std::string pressure = "/sequence/heat_shield_jettison_dynamic_pressure_Pa";
            if (shape == 1) {
                m_document->setValues({{delay, Json()}, {pressure, 100.0}},
                                      tr("Jettison the heat shield on dynamic pressure"));
            } else {
                m_document->setValues({{pressure, Json()}, {delay, 20.0}},
                                      tr("Jettison the heat shield after a delay"));
            }
        });
    addNumber(form, tr("Jettison delay"), "/sequence/heat_shield_jettison_delay_s", Dimension::time,
              atLeastZero(15, 25), true, "20 s");
    addNumber(form, tr("Jettison dynamic pressure"),
              "/sequence/heat_shield_jettison_dynamic_pressure_Pa", Dimension::pressure,
              positive(50, 200), false);
    addNumber(form, tr("Ground-sensing lock"), "/sequence/ground_sensing_lock_s", Dimension::time,
              atLeastZero(10, 30), true, "15 s");
    addNumber(form, tr("Separation coast"), "/sequence/separation_coast_s", Dimension::time,
              atLeastZero(1, 3), true, "2 s");
}

void DesignForm::buildMass() {
    QFormLayout* form = addSection(tr("Mass budget"));
    addNumber(form, tr("Entry mass"), "/mass/entry_kg", Dimension::mass, positive(300, 3500), true,
              tr("closed from the items"));
    addNumber(form, tr("Heat shield"), "/mass/heat_shield_kg", Dimension::mass,
              atLeastZero(40, 400), true, tr("estimated"));
    addNumber(form, tr("Backshell"), "/mass/backshell_kg", Dimension::mass, atLeastZero(30, 300),
              true, tr("estimated"));

    m_items = new QTableWidget(0, 4, this);
    m_items->setObjectName("/mass/items");
    m_items->setHorizontalHeaderLabels({tr("Item"), tr("Basic mass (kg)"), tr("Group"), tr("Maturity")});
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
        if (!items.is_array()) items = Json::array();
        items.push_back({{"name", "new item"}, {"mass_kg", 10.0}, {"group", "payload"},
                         {"maturity", "estimated"}});
        m_document->setValue("/mass/items", items, tr("Add a mass item"));
    });
    connect(remove, &QPushButton::clicked, this, [this] {
        const int row = m_items->currentRow();
        Json items = m_document->value("/mass/items");
        if (row < 0 || !items.is_array() || row >= static_cast<int>(items.size())) return;
        items.erase(static_cast<std::size_t>(row));
        m_document->setValue("/mass/items", items, tr("Remove a mass item"));
    });
    connect(m_items, &QTableWidget::cellChanged, this, [this] {
        if (!m_refreshing) writeItems();
    });
}

void DesignForm::buildLimits() {
    QFormLayout* form = addSection(tr("Limits"));
    const Limits defaults;
    for (const LimitField& field : limit_fields()) {
        const QString label = QString::fromUtf8(field.key.data(), static_cast<int>(field.key.size()))
                                  .replace('_', ' ');
        const double fallback = defaults.*field.member;
        addNumber(form, label, "/limits/" + std::string(field.key), dimensionOfUnit(field.unit),
                  anyValue(fallback, fallback), true,
                  QString::fromStdString(formatQuantity(fallback)) + " " +
                      QString::fromUtf8(field.unit.data(), static_cast<int>(field.unit.size())));
    }
}

void DesignForm::refresh() {
    m_refreshing = true;
    const std::vector<ReadError>& errors = m_document->errors();
    for (NumberBinding& b : m_numbers) {
        const Json v = m_document->value(b.pointer);
        b.edit->setValue(v.is_number() ? std::optional<double>(v.get<double>()) : std::nullopt);
        b.edit->setExternalError({});
    }
    for (ChoiceBinding& c : m_choices) {
        const QSignalBlocker block(c.combo);
        const Json v = m_document->value(c.pointer);
        int index = -1;
        for (std::size_t i = 0; i < c.values.size(); ++i) {
            if (v == c.values[i]) index = static_cast<int>(i);
        }
        c.combo->setCurrentIndex(index);
    }
    for (ShapeBinding& s : m_shapes) {
        const QSignalBlocker block(s.combo);
        s.combo->setCurrentIndex(s.current());
    }

    // Show the rows the document's shape has.
    const auto present = [&](const std::string& pointer) { return !m_document->value(pointer).is_null(); };
    const bool sizedShell = m_document->value("/aeroshell/diameter_m").is_object();
    setRowVisible("/aeroshell/diameter_m", !sizedShell);
    setRowVisible("/aeroshell/diameter_m/size_for_ballistic_coefficient_kg_m2", sizedShell);
    const bool sizedChute = m_document->value("/parachute/diameter_m").is_object();
    setRowVisible("/parachute/diameter_m", !sizedChute);
    setRowVisible("/parachute/diameter_m/size_for_velocity_m_s", sizedChute);
    setRowVisible("/parachute/diameter_m/at_height_above_site_m", sizedChute);
    for (const std::string& key : trigger_keys) {
        setRowVisible("/parachute/" + key, present("/parachute/" + key));
    }
    const bool decelerator = m_document->value("/decelerator").is_object();
    for (const char* key : {"diameter_m", "drag_coefficient", "deploy_mach", "mass_kg"}) {
        setRowVisible(std::string("/decelerator/") + key, decelerator);
    }
    const bool exponential = m_document->value("/atmosphere/model") == "exponential";
    for (const char* key : {"surface_density_kg_m3", "scale_height_m", "temperature_K"}) {
        setRowVisible(std::string("/atmosphere/") + key, exponential);
    }
    const Json method = m_document->value("/terminal/method");
    for (const std::string& key : engine_keys) setRowVisible("/terminal/" + key, method != "none");
    setRowVisible("/terminal/release_height_m", method == "airbag");
    setRowVisible("/terminal/tether_length_m", method == "tethered");
    setRowVisible("/terminal/fly_away_s", method == "tethered");
    const bool onPressure = present("/sequence/heat_shield_jettison_dynamic_pressure_Pa");
    setRowVisible("/sequence/heat_shield_jettison_delay_s", !onPressure);
    setRowVisible("/sequence/heat_shield_jettison_dynamic_pressure_Pa", onPressure);
    refreshItems();

    // Errors of the reader at their fields; the rest above the forms.
    QStringList unplaced;
    for (const ReadError& error : errors) {
        bool placed = false;
        for (NumberBinding& b : m_numbers) {
            if (pointerToPath(b.pointer) == error.path && b.row->isVisibleTo(this)) {
                b.edit->setExternalError(QString::fromStdString(error.message));
                placed = true;
            }
        }
        if (!placed) unplaced << QString::fromStdString(error.text());
    }
    m_documentErrors->setText(tr("The design cannot be sized yet:\n%1").arg(unplaced.join('\n')));
    m_documentErrors->setVisible(!unplaced.isEmpty());
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
            if (v.is_string()) return QString::fromStdString(v.get<std::string>());
            if (v.is_number()) return QString::fromStdString(formatQuantity(v.get<double>()));
            return QString();
        };
        m_items->setItem(row, 0, new QTableWidgetItem(text("name")));
        m_items->setItem(row, 1, new QTableWidgetItem(text("mass_kg")));
        auto* group = new QComboBox(m_items);
        group->addItems({"heat shield", "backshell", "descent stage", "payload"});
        group->setCurrentText(text("group"));
        auto* maturity = new QComboBox(m_items);
        maturity->addItems({"estimated", "layout", "pre-release", "released", "existing", "actual"});
        maturity->setCurrentText(text("maturity").isEmpty() ? "estimated" : text("maturity"));
        m_items->setCellWidget(row, 2, group);
        m_items->setCellWidget(row, 3, maturity);
        connect(group, &QComboBox::currentIndexChanged, this, [this] { if (!m_refreshing) writeItems(); });
        connect(maturity, &QComboBox::currentIndexChanged, this, [this] { if (!m_refreshing) writeItems(); });
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
        item["group"] = static_cast<QComboBox*>(m_items->cellWidget(row, 2))->currentText().toStdString();
        item["maturity"] = static_cast<QComboBox*>(m_items->cellWidget(row, 3))->currentText().toStdString();
        items.push_back(item);
    }
    m_document->setValue("/mass/items", items, tr("Edit the mass items"));
}

void DesignForm::setRowVisible(const std::string& pointer, bool visible) {
    for (NumberBinding& b : m_numbers) {
        if (b.pointer != pointer) continue;
        b.row->setVisible(visible);
        auto* form = qobject_cast<QFormLayout*>(b.row->parentWidget()->layout());
        if (form) {
            if (QWidget* label = form->labelForField(b.row)) label->setVisible(visible);
        }
    }
}

QWidget* DesignForm::fieldFor(const std::string& pointer) const {
    for (const NumberBinding& b : m_numbers) {
        if (b.pointer == pointer) return b.edit;
    }
    for (const ChoiceBinding& c : m_choices) {
        if (c.pointer == pointer) return c.combo;
    }
    if (pointer == "/mass/items") return m_items;
    return nullptr;
}

bool DesignForm::focusField(const std::string& pointer) {
    QWidget* field = fieldFor(pointer);
    if (!field || !field->isVisibleTo(this)) return false;
    for (QWidget* w = field->parentWidget(); w; w = w->parentWidget()) {
        if (auto* scroll = qobject_cast<QScrollArea*>(w)) {
            scroll->ensureWidgetVisible(field);
            break;
        }
    }
    field->setFocus(Qt::OtherFocusReason);
    if (auto* edit = qobject_cast<QLineEdit*>(field)) edit->selectAll();
    return true;
}

}  // namespace ds
