#include "sheet/sheet_sections.hpp"

#include <algorithm>
#include <string>
#include <string_view>
#include <vector>

#include "design/key_path.hpp"
#include "design/schema.hpp"
#include "design/writer.hpp"
#include "results/caution.hpp"
#include "results/key_figures.hpp"
#include "sheet/sheet_format.hpp"
#include "trade/study.hpp"
#include "verification/reference_cases.hpp"

namespace ds::sheet {
namespace {

struct InputRow {
    QString key;
    QString value;
    QString unit;
    bool numeric = false;
};

QString jsonValueText(const nlohmann::ordered_json& value) {
    if (value.is_null())
        return QStringLiteral("—");
    if (value.is_boolean())
        return value.get<bool>() ? QStringLiteral("true") : QStringLiteral("false");
    if (value.is_number_integer())
        return QString::number(value.get<long long>());
    if (value.is_number())
        return QString::number(value.get<double>(), 'g', 9);
    if (value.is_string())
        return QString::fromStdString(value.get<std::string>());
    return QString::fromStdString(value.dump());
}

void flatten(const nlohmann::ordered_json& node, const std::string& path,
             std::vector<InputRow>& rows) {
    if (node.is_object() && !node.empty()) {
        for (const auto& [key, value] : node.items())
            flatten(value, path.empty() ? key : path + "." + key, rows);
        return;
    }
    if (node.is_array() && !node.empty()) {
        for (std::size_t i = 0; i < node.size(); ++i)
            flatten(node[i], path + "[" + std::to_string(i) + "]", rows);
        return;
    }
    InputRow row;
    std::string key = path;
    // The unit from the schema, in its own column: the key is shown without it.
    if (const std::string_view unit = unit_of_path(path); !unit.empty()) {
        row.unit = QString::fromUtf8(unit.data(), static_cast<qsizetype>(unit.size()));
        const std::string spelled = unit_in_key_name(unit);
        if (key.ends_with(spelled) && key.size() > spelled.size() &&
            key[key.size() - spelled.size() - 1] == '_')
            key.resize(key.size() - spelled.size() - 1);
    }
    row.key = QString::fromStdString(key);
    row.numeric = node.is_number();
    row.value =
        (node.is_array() || node.is_object()) ? QStringLiteral("none") : jsonValueText(node);
    rows.push_back(std::move(row));
}

}  // namespace

QString designSection(const Design& design, const Results& results) {
    const auto count = [&](CheckStatus status) {
        return std::count_if(results.checks.begin(), results.checks.end(),
                             [status](const Check& c) { return c.status == status; });
    };
    const QString body = design.body.preset.empty() ? QString::fromStdString(design.body.body.name)
                                                    : QString::fromStdString(design.body.preset);
    HtmlTable table({QStringLiteral("item"), QStringLiteral("value")});
    table.addRow({{QStringLiteral("design"), {}}, {QString::fromStdString(design.name), {}}});
    table.addRow({{QStringLiteral("body"), {}}, {body, {}}});
    table.addRow({{QStringLiteral("atmosphere model"), {}},
                  {QString::fromUtf8(to_string(design.atmosphere.model)), {}}});
    table.addRow({{QStringLiteral("site elevation"), {}},
                  {QStringLiteral("%1 m").arg(formatValue(design.site.elevation_m)), {}}});
    table.addRow({{QStringLiteral("terminal descent"), {}},
                  {QString::fromUtf8(to_string(design.terminal.method)), {}}});
    table.addRow({{QStringLiteral("mass budget"), {}},
                  {results.mass.mode == MassMode::sizing
                       ? QStringLiteral("sizing: entry mass closed by iteration")
                       : QStringLiteral("analysis: entry mass fixed by the design"),
                   {}}});
    table.addRow({{QStringLiteral("converged (flown, mass closed)"), {}},
                  {results.converged ? QStringLiteral("yes") : QStringLiteral("no"), {}}});
    table.addRow({{QStringLiteral("checks"), {}},
                  {QStringLiteral("%1 failing, %2 marginal, %3 passing")
                       .arg(count(CheckStatus::fail))
                       .arg(count(CheckStatus::marginal))
                       .arg(count(CheckStatus::pass)),
                   {}}});
    return section(QStringLiteral("Design"), table.html());
}

QString cautionSection(const Results& results) {
    QString body = paragraph(QString::fromStdString(std::string(conceptual_caution)),
                             QStringLiteral("caution"));
    QString notes;
    for (const std::string& note : results.notes) {
        if (note != conceptual_caution)  // shown above
            notes += QStringLiteral("<li>%1</li>\n").arg(escaped(note));
    }
    if (!notes.isEmpty())
        body += QStringLiteral("<ul>\n%1</ul>\n").arg(notes);
    return section(QStringLiteral("Caution"), body);
}

QString keyFiguresSection(const Results& results) {
    HtmlTable table({QStringLiteral("figure"), QStringLiteral("value"), QStringLiteral("unit")});
    for (const KeyFigure& figure : key_figures(results)) {
        table.addRow({{QString::fromStdString(figure.label), {}},
                      {formatFixed(figure.value, figure.decimals), numberCell},
                      {QString::fromStdString(figure.unit), {}}});
    }
    return section(QStringLiteral("Key figures"), table.html());
}

QString entryStartSection(const Results& results) {
    if (!results.approach && !results.orbit)
        return {};
    HtmlTable table({QStringLiteral("figure"), QStringLiteral("value"), QStringLiteral("unit")});
    const auto add = [&](const char* label, double value, int decimals, const char* unit) {
        table.addRow({{QString::fromUtf8(label), {}},
                      {formatFixed(value, decimals), numberCell},
                      {QString::fromUtf8(unit), {}}});
    };
    const auto frames = [&](const EntryVelocity& relative, const EntryVelocity& inertial) {
        add("interface speed, planet-relative", relative.velocity_m_s, 1, "m/s");
        add("interface flight-path angle, planet-relative", relative.flight_path_angle_deg, 3,
            "deg");
        add("interface speed, inertial", inertial.velocity_m_s, 1, "m/s");
        add("interface flight-path angle, inertial", inertial.flight_path_angle_deg, 3, "deg");
    };
    if (const auto& a = results.approach) {
        add("excess speed (v infinity)", a->v_infinity_m_s, 1, "m/s");
        add("semi-major axis", a->semi_major_axis_m / 1000.0, 1, "km");
        add("eccentricity", a->eccentricity, 5, "");
        add("periapsis altitude (in vacuum)", a->periapsis_altitude_m, 0, "m");
        add("impact parameter", a->impact_parameter_m / 1000.0, 1, "km");
        add("turn angle", a->turn_angle_deg, 2, "deg");
        frames(a->relative, a->inertial);
        return section(QStringLiteral("Approach"), table.html());
    }
    const OrbitResults& o = *results.orbit;
    add("orbit periapsis altitude", o.periapsis_altitude_m, 0, "m");
    add("orbit apoapsis altitude", o.apoapsis_altitude_m, 0, "m");
    add("deorbit delta-v (impulsive, at apoapsis)", o.delta_v_m_s, 2, "m/s");
    add("propellant", o.propellant_kg, 1, "kg");
    add("deorbit stage, dropped before entry", o.stage_kg, 1, "kg");
    add("mass before the burn", o.mass_before_burn_kg, 1, "kg");
    add("transfer periapsis altitude (in vacuum)", o.transfer_periapsis_altitude_m, 0, "m");
    add("coast from the burn to the interface", o.coast_s, 1, "s");
    frames(o.relative, o.inertial);
    return section(QStringLiteral("Deorbit burn"), table.html());
}

QString massSection(const Results& results) {
    const MassResults& mass = results.mass;
    HtmlTable table({QStringLiteral("item"), QStringLiteral("group"), QStringLiteral("maturity"),
                     QStringLiteral("basic (kg)"), QStringLiteral("growth (%)"),
                     QStringLiteral("mass (kg)"), QStringLiteral("source")});
    for (const MassItem& item : mass.items) {
        table.addRow({{QString::fromStdString(item.name), {}},
                      {QString::fromUtf8(to_string(item.group)), {}},
                      {QString::fromUtf8(maturity_name(item)), {}},
                      {QString::number(item.basic_kg, 'f', 1), numberCell},
                      {QString::number(100.0 * item.growth_fraction, 'f', 0), numberCell},
                      {QString::number(item.mass_kg, 'f', 1), numberCell},
                      {QString::fromStdString(item.source), {}}});
    }
    const QString total = QStringLiteral("total");
    table.addRow({{QStringLiteral("entry mass"), {}},
                  {},
                  {},
                  {},
                  {},
                  {QString::number(mass.entry_kg, 'f', 1), numberCell},
                  {}},
                 total);
    table.addRow({{QStringLiteral("landed mass"), {}},
                  {},
                  {},
                  {},
                  {},
                  {formatFixed(mass.landed_kg, 1), numberCell},
                  {}},
                 total);
    QString body = table.html();
    if (mass.closure) {
        const MassClosure& closure = *mass.closure;
        body += paragraph(
            closure.converged
                ? QStringLiteral("Mass closure: converged in %1 iterations, residual %2 kg.")
                      .arg(closure.iterations)
                      .arg(formatValue(closure.residual_kg))
                : QStringLiteral("Mass closure: did not converge in %1 iterations, residual %2 kg.")
                      .arg(closure.iterations)
                      .arg(formatValue(closure.residual_kg)));
    }
    return section(QStringLiteral("Mass budget"), body);
}

QString timelineSection(const Design& design, const Results& results) {
    HtmlTable table({QStringLiteral("#"), QStringLiteral("event"), QStringLiteral("time (s)"),
                     QStringLiteral("altitude (m)"), QStringLiteral("height above site (m)"),
                     QStringLiteral("velocity (m/s)")});
    int number = 0;
    for (const TimelineEvent& event : results.timeline.events) {
        table.addRow(
            {{QString::number(++number), numberCell},
             {QString::fromStdString(event.name), {}},
             {QString::number(event.time_s, 'f', 1), numberCell},
             {QString::number(event.altitude_m, 'f', 0), numberCell},
             {QString::number(event.altitude_m - design.site.elevation_m, 'f', 0), numberCell},
             {QString::number(event.velocity_m_s, 'f', 1), numberCell}});
    }
    const Timeline& timeline = results.timeline;
    QString body = table.html();
    QString margin = QStringLiteral("Timeline margin: %1 s").arg(formatFixed(timeline.margin_s, 1));
    if (timeline.available_s && timeline.needed_s)
        margin += QStringLiteral(
                      " (%1 s available between parachute deploy and the terminal "
                      "phase, %2 s needed by the sequence)")
                      .arg(formatFixed(timeline.available_s, 1), formatFixed(timeline.needed_s, 1));
    body += paragraph(margin + QLatin1Char('.'));
    QString highest = QStringLiteral("Highest feasible site elevation: %1 m")
                          .arg(formatFixed(results.capability.max_site_elevation_m, 0));
    if (const auto limit = results.capability.max_site_elevation_limit) {
        const std::string_view words = site_limit_text(*limit);
        highest += QStringLiteral(" (%1)").arg(
            QString::fromUtf8(words.data(), static_cast<qsizetype>(words.size())));
        if (*limit != SiteLimit::timeline_margin)
            highest += QStringLiteral(
                ": the timeline margin lasts up to that altitude, and no "
                "higher site is looked at");
    }
    body += paragraph(highest + QLatin1Char('.'));
    return section(QStringLiteral("Timeline"), body);
}

QString checksSection(const Results& results) {
    HtmlTable table({QStringLiteral("status"), QStringLiteral("id"), QStringLiteral("value"),
                     QStringLiteral("limit"), QStringLiteral("unit"), QStringLiteral("message"),
                     QStringLiteral("source")});
    for (const Check& check : results.checks) {
        const QString status = QString::fromUtf8(to_string(check.status));
        table.addRow({{status, status},
                      {QString::fromStdString(check.id), keyCell},
                      {formatValue(check.value), numberCell},
                      {formatValue(check.limit), numberCell},
                      {QString::fromStdString(check.unit), {}},
                      {QString::fromStdString(check.message), {}},
                      {QString::fromStdString(check.source), {}}});
    }
    return section(QStringLiteral("Checks"), table.html());
}

QString reviewChecksSection(const Results& results) {
    HtmlTable table({QStringLiteral("status"), QStringLiteral("id"), QStringLiteral("message")});
    int shown = 0;
    for (const Check& check : results.checks) {
        if (check.status == CheckStatus::pass)
            continue;
        const QString status = QString::fromUtf8(to_string(check.status));
        table.addRow({{status, status},
                      {QString::fromStdString(check.id), keyCell},
                      {QString::fromStdString(check.message), {}}});
        ++shown;
    }
    const QString heading = QStringLiteral("Checks that fail or are marginal");
    if (shown == 0) {
        return section(heading, paragraph(QStringLiteral("None: every one of the %1 checks passes.")
                                              .arg(results.checks.size())));
    }
    return section(heading,
                   table.html() + paragraph(QStringLiteral("%1 of %2 checks; every check, with its "
                                                           "value, limit and source, follows.")
                                                .arg(shown)
                                                .arg(results.checks.size())));
}

namespace {

QString fromView(std::string_view text) {
    return QString::fromUtf8(text.data(), static_cast<qsizetype>(text.size()));
}

QString sectionTitle(const SectionRow& section) {
    if (!section.label.empty())
        return fromView(section.label);
    QString name = fromView(section.name);
    if (!name.isEmpty())
        name[0] = name[0].toUpper();
    return name;
}

}  // namespace

QString inputsAppendix(const Design& design) {
    const nlohmann::ordered_json document = design_to_json(design);
    const Design defaults;
    QString body = paragraph(QStringLiteral(
        "The design's inputs as the form groups and labels them. \"default\" marks a value the "
        "design leaves to the program's default; an optional input left out says what stands in "
        "its place."));
    const auto byHandRows = [&](HtmlTable& table, const nlohmann::ordered_json& part,
                                const std::string& path) {
        std::vector<InputRow> rows;
        flatten(part, path, rows);
        for (const InputRow& row : rows) {
            table.addRow({{row.key, keyCell},
                          {row.value, row.numeric ? numberCell : QString()},
                          {row.unit, {}},
                          {QString(), {}}});
        }
    };
    for (const SectionRow& section : design_sections()) {
        if ((section.present && !section.present(design)) || !document.contains(section.name))
            continue;
        HtmlTable table({QStringLiteral("input"), QStringLiteral("value"), QStringLiteral("unit"),
                         QStringLiteral("note")});
        const std::string name(section.name);
        if (section.by_hand) {
            byHandRows(table, document.at(name), name);
        } else {
            for (const KeyRow* row : keys_of(section.name)) {
                if (!belongs_to_design(*row, design))
                    continue;
                const QString label = QString::fromStdString(label_of(*row));
                const QString unit = fromView(row->unit);
                switch (row->kind) {
                    case KeyKind::number:
                    case KeyKind::integer:
                    case KeyKind::number_or_request: {
                        const std::optional<double> value = row->number.get(design);
                        if (!value) {
                            // An optional input left out: what stands in its place.
                            if (row->need == KeyNeed::optional && row->parent.empty() &&
                                !row->group) {
                                table.addRow({{label.trimmed(), {}},
                                              {QStringLiteral("—"), numberCell},
                                              {unit, {}},
                                              {fromView(row->placeholder), {}}});
                            }
                            break;
                        }
                        const std::optional<double> fallback = default_of(*row);
                        const bool isDefault =
                            row->need == KeyNeed::defaulted && fallback && *fallback == *value;
                        table.addRow({{label.trimmed(), {}},
                                      {QString::number(*value, 'g', 9), numberCell},
                                      {unit, {}},
                                      {isDefault ? QStringLiteral("default") : QString(), {}}});
                        break;
                    }
                    case KeyKind::choice:
                    case KeyKind::text: {
                        const std::string_view text = row->text.get(design);
                        if (text.empty())
                            break;
                        const bool isDefault =
                            row->need == KeyNeed::defaulted && row->text.get(defaults) == text;
                        table.addRow({{label.trimmed(), {}},
                                      {fromView(text), {}},
                                      {QString(), {}},
                                      {isDefault ? QStringLiteral("default") : QString(), {}}});
                        break;
                    }
                    case KeyKind::object:
                        break;  // its keys are rows of their own
                    case KeyKind::by_hand: {
                        const nlohmann::ordered_json::json_pointer pointer(
                            key_to_pointer(row->path()));
                        if (document.contains(pointer))  // "items[0].name" in "Mass"
                            byHandRows(table, document.at(pointer), std::string(row->key));
                        break;
                    }
                }
            }
        }
        body += QStringLiteral("<h3>%1</h3>\n%2").arg(escaped(sectionTitle(section)), table.html());
    }
    return sectionOnNewPage(QStringLiteral("Appendix A: inputs"), body);
}

QString verificationAppendix() {
    const std::vector<ReferenceCase> cases = run_reference_cases();
    HtmlTable table(
        {QStringLiteral("case: source"), QStringLiteral("expected"), QStringLiteral("computed"),
         QStringLiteral("unit"), QStringLiteral("agreement"), QString()},
        QStringLiteral("compact"));
    int agreeing = 0;
    for (const ReferenceCase& c : cases) {
        const bool agrees = c.agrees();
        agreeing += agrees ? 1 : 0;
        table.addRow({{QString::fromStdString(c.title + ": " + c.source), {}},
                      {QString::number(c.expected, 'g', 8), numberCell},
                      {QString::number(c.computed, 'g', 8), numberCell},
                      {QString::fromStdString(c.unit), {}},
                      {QString::fromStdString(c.agreement()), {}},
                      {agrees ? QStringLiteral("agrees") : QStringLiteral("MISSED"),
                       agrees ? QStringLiteral("pass") : QStringLiteral("fail")}});
    }
    const QString intro = paragraph(
        QStringLiteral("The program's models run now on published reference cases and against an "
                       "independent integration of the same equations (descent-sizer verify "
                       "prints the same): %1 of %2 agree within their tolerance. Agreement shows "
                       "the equations are solved as written; it does not validate the models "
                       "against flight data.")
            .arg(agreeing)
            .arg(cases.size()));
    return sectionOnNewPage(QStringLiteral("Appendix B: verification"), intro + table.html());
}

QString landingSection(const Design& design, const Results& results, const StudyOutcome* trade) {
    constexpr double km = 1e-3;
    const auto kmText = [](const std::optional<double>& metres) {
        return metres ? formatFixed(*metres * km, 2) : formatFixed(std::nullopt, 2);
    };
    QString body;
    if (const auto& landing = results.landing) {
        HtmlTable table({QStringLiteral("item"), QStringLiteral("value"), QStringLiteral("unit")});
        const auto row = [&](const QString& item, const QString& value, const QString& unit) {
            table.addRow({{item, {}}, {value, numberCell}, {unit, {}}});
        };
        row(QStringLiteral("latitude"), formatFixed(landing->latitude_deg, 4),
            QStringLiteral("deg"));
        row(QStringLiteral("longitude"), formatFixed(landing->longitude_deg, 4),
            QStringLiteral("deg"));
        row(QStringLiteral("downrange from the entry point"), kmText(landing->downrange_m),
            QStringLiteral("km"));
        row(QStringLiteral("crossrange (right of the entry heading)"),
            kmText(landing->crossrange_m), QStringLiteral("km"));
        if (design.site.latitude_deg && design.site.longitude_deg) {
            row(QStringLiteral("target latitude"), formatFixed(*design.site.latitude_deg, 4),
                QStringLiteral("deg"));
            row(QStringLiteral("target longitude"), formatFixed(*design.site.longitude_deg, 4),
                QStringLiteral("deg"));
            row(QStringLiteral("miss distance"), kmText(landing->miss_m), QStringLiteral("km"));
            row(QStringLiteral("miss downrange (long of the target when positive)"),
                kmText(landing->miss_downrange_m), QStringLiteral("km"));
            row(QStringLiteral("miss crossrange (right of the target when positive)"),
                kmText(landing->miss_crossrange_m), QStringLiteral("km"));
        }
        body += table.html();
        if (!(design.site.latitude_deg && design.site.longitude_deg))
            body += paragraph(QStringLiteral(
                "The design gives no target site (site.latitude_deg, site.longitude_deg): "
                "no miss distance."));
    } else {
        body += paragraph(QStringLiteral("The lander does not come down: no landing point."));
    }
    if (trade && trade->request.kind == StudyKind::dispersions) {
        if (const auto& ellipse = trade->summary.landing_ellipse) {
            const EllipseAxes& axes = ellipse->axes;
            HtmlTable table({QStringLiteral("landing ellipse"), QStringLiteral("value"),
                             QStringLiteral("unit")});
            const auto row = [&](const QString& item, const QString& value, const QString& unit) {
                table.addRow({{item, {}}, {value, numberCell}, {unit, {}}});
            };
            row(QStringLiteral("probability held"), formatFixed(100.0 * ellipse->probability, 1),
                QStringLiteral("%"));
            row(QStringLiteral("landing points used"), QString::number(ellipse->count), {});
            row(QStringLiteral("mean latitude"), formatFixed(ellipse->centre_latitude_deg, 4),
                QStringLiteral("deg"));
            row(QStringLiteral("mean longitude"), formatFixed(ellipse->centre_longitude_deg, 4),
                QStringLiteral("deg"));
            row(QStringLiteral("major axis (full length)"),
                formatFixed(2.0 * axes.semi_major_km, 2), QStringLiteral("km"));
            row(QStringLiteral("minor axis (full length)"),
                formatFixed(2.0 * axes.semi_minor_km, 2), QStringLiteral("km"));
            row(QStringLiteral("major axis azimuth (clockwise from north)"),
                formatFixed(axes.major_axis_azimuth_deg, 1), QStringLiteral("deg"));
            row(QStringLiteral("east standard deviation"), formatFixed(axes.east_sigma_km, 2),
                QStringLiteral("km"));
            row(QStringLiteral("north standard deviation"), formatFixed(axes.north_sigma_km, 2),
                QStringLiteral("km"));
            row(QStringLiteral("east-north correlation"), formatFixed(axes.correlation, 3), {});
            body += table.html();
        } else {
            body += paragraph(QStringLiteral(
                "The dispersion study has no landing ellipse: fewer than two cases came down."));
        }
    }
    return section(QStringLiteral("Landing"), body);
}

}  // namespace ds::sheet
