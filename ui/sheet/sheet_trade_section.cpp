#include "sheet/sheet_trade_section.hpp"

#include <algorithm>
#include <string>

#include "model/trade_runner.hpp"
#include "results/key_figures.hpp"
#include "sheet/sheet_format.hpp"
#include "trade/success_probability.hpp"

namespace ds::sheet {
namespace {

/// The rows of a sweep: the varied values, the figure shown, the worst check and the margin.
QString sweepTable(const StudyOutcome& trade, const std::string& figureId) {
    const std::size_t figure = key_figure_index(figureId).value_or(key_figure_table.size() - 1);
    const KeyFigureDefinition& shown = key_figure_table[figure];
    QStringList headings;
    for (const SweepAxis& axis : trade.request.axes)
        headings << QString::fromStdString(axis.key);
    headings << QStringLiteral("%1 (%2)").arg(
                    QString::fromUtf8(shown.label.data(), static_cast<int>(shown.label.size())),
                    QString::fromUtf8(shown.unit.data(), static_cast<int>(shown.unit.size())))
             << QStringLiteral("worst check") << QStringLiteral("feasibility margin (%)");
    HtmlTable table(headings);
    for (const SweepCase& c : trade.sweep) {
        std::vector<std::pair<QString, QString>> cells;
        for (const double v : c.inputs)
            cells.push_back({formatValue(v), numberCell});
        if (!c.results) {
            cells.push_back({QStringLiteral("—"), numberCell});
            cells.push_back(
                {QStringLiteral("cannot be read: %1").arg(QString::fromStdString(c.error)),
                 QStringLiteral("fail")});
            cells.push_back({QStringLiteral("—"), numberCell});
        } else {
            const std::optional<double> value = shown.value(*c.results);
            const WorstCheck worst = worst_check(*c.results);
            const FeasibilityMargin margin = feasibility_margin(*c.results);
            const QString status = QString::fromUtf8(to_string(worst.status));
            cells.push_back({formatFixed(value, shown.decimals), numberCell});
            cells.push_back({worst.id.empty() ? status
                                              : QStringLiteral("%1: %2").arg(
                                                    status, QString::fromStdString(worst.id)),
                             status});
            cells.push_back(
                {margin.margin ? QString::number(*margin.margin * 100.0, 'f', 1)
                               : QStringLiteral("none (%1)").arg(QString::fromStdString(margin.id)),
                 numberCell});
        }
        table.addRow(cells);
    }
    return table.html();
}

QString dispersionTables(const StudyOutcome& trade) {
    const DispersionSummary& s = trade.summary;
    QString body = paragraph(QString::fromStdString(success_probability_sentence(s)));
    QStringList dispersed;
    for (const DispersionDesign& d : trade.design.dispersions) {
        dispersed << (d.distribution == DistributionKind::normal
                          ? QStringLiteral("%1: normal, sigma %2")
                                .arg(QString::fromStdString(d.key), formatValue(d.sigma))
                          : QStringLiteral("%1: uniform, %2 to %3")
                                .arg(QString::fromStdString(d.key), formatValue(d.min),
                                     formatValue(d.max)));
    }
    body += paragraph(
        QStringLiteral("Dispersed inputs: %1.").arg(dispersed.join(QStringLiteral("; "))));
    HtmlTable table({QStringLiteral("figure"), QStringLiteral("unit"), QStringLiteral("cases"),
                     QStringLiteral("mean"), QStringLiteral("std dev"), QStringLiteral("1st pct"),
                     QStringLiteral("median"), QStringLiteral("99th pct")});
    for (const FigureStatistics& f : s.figures) {
        if (f.count == 0)
            continue;
        table.addRow({{QString::fromStdString(f.id), keyCell},
                      {QString::fromStdString(f.unit), {}},
                      {QString::number(f.count), numberCell},
                      {formatValue(f.mean), numberCell},
                      {formatValue(f.standard_deviation), numberCell},
                      {formatValue(f.p01), numberCell},
                      {formatValue(f.p50), numberCell},
                      {formatValue(f.p99), numberCell}});
    }
    body += table.html();
    if (!s.failing_checks.empty()) {
        HtmlTable failing({QStringLiteral("failing check"), QStringLiteral("cases"),
                           QStringLiteral("share (%)")});
        for (const auto& [id, count] : s.failing_checks) {
            failing.addRow(
                {{QString::fromStdString(id), keyCell},
                 {QString::number(count), numberCell},
                 {QString::number(100.0 * static_cast<double>(count) / static_cast<double>(s.runs),
                                  'f', 2),
                  numberCell}});
        }
        body += failing.html();
    }
    return body;
}

QString sensitivityTable(const StudyOutcome& trade) {
    constexpr std::size_t drivers = 3;
    const SensitivityTable& table = *trade.sensitivities;
    HtmlTable html({QStringLiteral("figure"),
                    QStringLiteral("strongest drivers, d ln(figure) / d ln(input)")});
    for (std::size_t f = 0; f < table.figures.size(); ++f) {
        const auto ranked = table.ranked(f);
        QStringList text;
        for (std::size_t k = 0; k < ranked.size() && k < drivers; ++k)
            text << QStringLiteral("%1 %2")
                        .arg(QString::fromStdString(ranked[k].first))
                        .arg(ranked[k].second, 0, 'f', 3);
        html.addRow({{QString::fromStdString(table.figures[f]), keyCell},
                     {text.isEmpty() ? QStringLiteral("—") : text.join(QStringLiteral("; ")), {}}});
    }
    return html.html();
}

QString successCell(const std::optional<DispersedAngle>& d) {
    return d ? QStringLiteral("%1 (%2–%3)")
                   .arg(100.0 * d->success_probability, 0, 'f', 1)
                   .arg(100.0 * d->wilson_low, 0, 'f', 1)
                   .arg(100.0 * d->wilson_high, 0, 'f', 1)
             : QStringLiteral("—");
}

/// A row per speed: each bound and what binds it, the width, and the dispersed success.
QString corridorTable(const StudyOutcome& trade) {
    const EntryCorridor& c = *trade.corridor;
    QString body = paragraph(
        QStringLiteral("Flight-path angles in %1 (%2); each bound root-found to %3 deg on the "
                       "feasibility margin; the design at %4 and %5 deg.")
            .arg(QString::fromStdString(c.angle_key), QString::fromStdString(c.frame))
            .arg(corridor_angle_tolerance_deg)
            .arg(formatValue(c.nominal_speed))
            .arg(c.nominal_angle_deg, 0, 'f', 2));
    const bool dispersed = std::any_of(c.speeds.begin(), c.speeds.end(),
                                       [](const CorridorSpeed& r) { return r.dispersed_centre; });
    QStringList headings{c.speed_key.empty() ? QStringLiteral("speed (inertial, m/s)")
                                             : QString::fromStdString(c.speed_key),
                         QStringLiteral("shallow (deg)"),
                         QStringLiteral("binds"),
                         QStringLiteral("steep (deg)"),
                         QStringLiteral("binds"),
                         QStringLiteral("width (deg)")};
    if (dispersed)
        headings << QStringLiteral("success at shallow, centre, steep (%, 95 % interval)");
    HtmlTable table(headings);
    const auto binds = [](const std::optional<CorridorBound>& b) {
        return b->closed ? QString::fromStdString(b->binding_check)
                         : QStringLiteral("open to the range's end");
    };
    for (const CorridorSpeed& row : c.speeds) {
        std::vector<std::pair<QString, QString>> cells{{formatValue(row.speed), numberCell}};
        if (!row.shallow || !row.steep) {
            cells.push_back(
                {QStringLiteral("no corridor: %1").arg(QString::fromStdString(row.error)),
                 QStringLiteral("fail")});
            for (int i = 0; i < 4; ++i)
                cells.push_back({QStringLiteral("—"), numberCell});
        } else {
            cells.push_back({QString::number(row.shallow->angle_deg, 'f', 3), numberCell});
            cells.push_back({binds(row.shallow), {}});
            cells.push_back({QString::number(row.steep->angle_deg, 'f', 3), numberCell});
            cells.push_back({binds(row.steep), {}});
            cells.push_back({QString::number(row.width_deg(), 'f', 3), numberCell});
        }
        if (dispersed) {
            cells.push_back(
                {QStringLiteral("%1; %2; %3")
                     .arg(successCell(row.dispersed_shallow), successCell(row.dispersed_centre),
                          successCell(row.dispersed_steep)),
                 {}});
        }
        table.addRow(cells);
    }
    return body + table.html();
}

/// The optimisation: each key at the design and at the optimum, the figure at both, what binds.
QString optimisationTable(const StudyOutcome& trade) {
    const Optimisation& o = *trade.optimisation;
    const QString figure = QString::fromStdString(o.settings.objective.figure);
    const auto value = [](const std::optional<double>& v) {
        return v ? formatValue(*v) : QStringLiteral("—");
    };
    QString body;
    if (!o.feasible) {
        body += paragraph(QStringLiteral("No design passing every check was found in %1 sizings; "
                                         "still failing at the least failing one: %2.")
                              .arg(o.sizings)
                              .arg(QString::fromStdString(violated_words(o))));
    } else {
        body += paragraph(
            QStringLiteral("%1: %2 at the design (%3), %4 at the optimum (passes "
                           "every check), in %5 sizings from %6 starts.")
                .arg(figure, value(o.start_objective),
                     o.start_feasible ? QStringLiteral("passes") : QStringLiteral("fails a check"),
                     value(o.best_objective))
                .arg(o.sizings)
                .arg(o.settings.starts));
    }
    HtmlTable table({QStringLiteral("key"), QStringLiteral("low"), QStringLiteral("high"),
                     QStringLiteral("design"), QStringLiteral("optimum"),
                     QStringLiteral("sensitivity")});
    for (std::size_t i = 0; i < o.settings.keys.size(); ++i) {
        const OptimisedKey& k = o.settings.keys[i];
        table.addRow(
            {{QString::fromStdString(k.key), {}},
             {formatValue(k.low), numberCell},
             {formatValue(k.high), numberCell},
             {formatValue(o.start_inputs[i]), numberCell},
             {o.feasible ? formatValue(o.best_inputs[i]) : QStringLiteral("—"), numberCell},
             {o.feasible ? value(o.sensitivities[i]) : QStringLiteral("—"), numberCell}});
    }
    body += table.html();
    if (o.feasible) {
        body += paragraph(QStringLiteral("Binding at the optimum: %1.")
                              .arg(QString::fromStdString(binding_words(o))));
    }
    return body;
}

}  // namespace

QString tradeSection(const SheetContext& context, const std::vector<SheetChart>& charts,
                     const ImageSource& source, int width) {
    constexpr std::size_t mostSweepRows = 60;
    const StudyOutcome& trade = *context.trade;
    QString body = paragraph(QStringLiteral("%1, run in %2 s.")
                                 .arg(QString::fromStdString(trade.description()))
                                 .arg(trade.seconds, 0, 'f', 2));
    body += chartImages(charts, true, source, width);
    switch (trade.request.kind) {
        case StudyKind::sweep:
            body += trade.sweep.size() <= mostSweepRows
                        ? sweepTable(trade, context.tradeFigure)
                        : paragraph(
                              QStringLiteral("%1 cases: their rows are in the study's CSV export.")
                                  .arg(trade.sweep.size()));
            break;
        case StudyKind::dispersions:
            body += dispersionTables(trade);
            break;
        case StudyKind::sensitivities:
            body += sensitivityTable(trade);
            break;
        case StudyKind::corridor:
            body += corridorTable(trade);
            break;
        case StudyKind::optimisation:
            body += optimisationTable(trade);
            break;
    }
    return section(QStringLiteral("Trade study"), body);
}

}  // namespace ds::sheet
