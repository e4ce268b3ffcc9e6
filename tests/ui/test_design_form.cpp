// The design form as the schema builds it, under the offscreen platform: a field for every
// number key, choices from the core's name tables, shapes that rewrite the document with the
// schema's fallbacks, and rows shown only where they apply.

#include <cmath>

#include <QApplication>
#include <QComboBox>
#include <QFile>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QTest>
#include <QUndoStack>
#include <QWheelEvent>

#include "body/body.hpp"
#include "design/key_path.hpp"
#include "design/schema.hpp"
#include "model/design_document.hpp"
#include "parachute/canopy.hpp"
#include "support/special_files.hpp"
#include "views/atmosphere_table.hpp"
#include "views/design_form.hpp"
#include "views/quantity_edit.hpp"
#include "views/wind_table.hpp"

using namespace ds;

namespace {

const QString sample = QStringLiteral(DESCENT_SIZER_SAMPLES_DIR "/small-ballistic-station.json");

using Json = DesignDocument::Json;

QComboBox* shape(const DesignForm& form, const QString& name) {
    return form.findChild<QComboBox*>(name);
}

/// Clears the field, types `text` and presses Enter, as a user would.
void type(QuantityEdit* edit, const QString& text) {
    edit->selectAll();
    QTest::keyClick(edit, Qt::Key_Backspace);
    QTest::keyClicks(edit, text);
    QTest::keyClick(edit, Qt::Key_Return);
}

bool shown(const DesignForm& form, const std::string& pointer) {
    QWidget* field = form.fieldFor(pointer);
    return field && field->isVisibleTo(&form);
}

}  // namespace

class DesignFormTest : public QObject {
    Q_OBJECT
private slots:
    void windTableWritesWhatTheReaderReadsBack() {
        DesignDocument document;
        QString error;
        const QString rover =
            QStringLiteral(DESCENT_SIZER_SAMPLES_DIR "/lifting-rover-carrier.json");
        QVERIFY2(document.open(rover, &error), qPrintable(error));
        DesignForm form(&document);
        auto* wind = form.findChild<WindTable*>();
        QVERIFY(wind);
        QTableWidget* table = wind->tableWidget();
        // The sample's three rows, as the file gives them.
        QCOMPARE(wind->shapeChoice()->currentIndex(), int(WindTable::table));
        QCOMPARE(table->rowCount(), 3);
        QCOMPARE(table->item(1, 0)->text(), QString("5000"));
        QCOMPARE(table->item(2, 2)->text(), QString("8"));

        // One edit, read back by the strict reader, undone in one step.
        const int before = document.undoStack()->count();
        table->item(1, 1)->setText("14.5");
        QCOMPARE(document.undoStack()->count(), before + 1);
        QVERIFY(document.design());
        QCOMPARE(document.design()->atmosphere.wind->rows.size(), std::size_t(3));
        QCOMPARE(document.design()->atmosphere.wind->rows[1].east_m_s, 14.5);
        QCOMPARE(document.design()->atmosphere.wind->rows[1].altitude_m, 5000.0);
        document.undoStack()->undo();
        QCOMPARE(document.design()->atmosphere.wind->rows[1].east_m_s, 12.0);
        QCOMPARE(table->item(1, 1)->text(), QString("12"));

        // An altitude below the previous row's is the reader's to refuse.
        table->item(2, 0)->setText("4000");
        QVERIFY(!document.design());
        document.undoStack()->undo();
        QVERIFY(document.design());

        // Rows pasted from a spreadsheet, its heading skipped: one edit.
        QVERIFY(wind->pasteRows("altitude_m\teast_m_s\tnorth_m_s\n0\t1.5\t-2\n8000\t6\t2.25\n"));
        QVERIFY(document.design());
        const auto& rows = document.design()->atmosphere.wind->rows;
        QCOMPARE(rows.size(), std::size_t(2));
        QCOMPARE(rows[0].north_m_s, -2.0);
        QCOMPARE(rows[1].altitude_m, 8000.0);
        QCOMPARE(rows[1].north_m_s, 2.25);
        QCOMPARE(table->rowCount(), 2);
        QVERIFY(!wind->pasteRows("no numbers here"));

        // One wind at every altitude: the table's lowest row's.
        wind->shapeChoice()->setCurrentIndex(WindTable::constant);
        emit wind->shapeChoice()->activated(WindTable::constant);
        QVERIFY(document.design());
        const auto& constant = document.design()->atmosphere.wind->constant;
        QVERIFY(constant);
        QCOMPARE(constant->east_m_s, 1.5);
        QCOMPARE(constant->north_m_s, -2.0);
        QVERIFY(document.value("/atmosphere/wind").is_object());
        table->item(0, 2)->setText("3");
        QCOMPARE(document.design()->atmosphere.wind->constant->north_m_s, 3.0);

        // No wind: the key leaves the document.
        wind->shapeChoice()->setCurrentIndex(WindTable::none);
        emit wind->shapeChoice()->activated(WindTable::none);
        QVERIFY(document.design());
        QVERIFY(!document.design()->atmosphere.wind);
        QVERIFY(document.value("/atmosphere/wind").is_null());
        QCOMPARE(table->rowCount(), 0);
    }

    void theWheelPassesOverAChoiceThatHasNoFocus() {
        // Regression: scrolling the form with the wheel switched the parachute type as the
        // pointer passed over its box. Without focus the box ignores the wheel; focused, it
        // takes it.
        DesignDocument document;
        QString error;
        QVERIFY2(document.open(sample, &error), qPrintable(error));
        DesignForm form(&document);
        form.show();
        auto* type = form.findChild<QComboBox*>(QStringLiteral("/parachute/type"));
        QVERIFY(type);
        const int before = type->currentIndex();
        const auto wheel = [&] {
            const QPointF at(type->width() / 2.0, type->height() / 2.0);
            QWheelEvent event(at, type->mapToGlobal(at), QPoint(), QPoint(0, -120), Qt::NoButton,
                              Qt::NoModifier, Qt::NoScrollPhase, false);
            QApplication::sendEvent(type, &event);
        };
        type->clearFocus();
        wheel();
        QCOMPARE(type->currentIndex(), before);
        QCOMPARE(type->focusPolicy(), Qt::StrongFocus);
        type->setFocus();
        QTRY_VERIFY(type->hasFocus());
        wheel();
        QVERIFY(type->currentIndex() != before);
    }

    void everyNumberKeyOfTheShownObjectsHasAField() {
        DesignDocument document;
        QString error;
        QVERIFY2(document.open(sample, &error), qPrintable(error));
        DesignForm form(&document);
        int fields = 0;
        for (const std::string_view section :
             {"site", "atmosphere", "entry", "aeroshell", "mass", "decelerator", "parachute",
              "sequence", "terminal", "limits"}) {
            for (const KeyRow* key : keys_of(section)) {
                if (key->kind != KeyKind::number && key->kind != KeyKind::number_or_request)
                    continue;
                const std::string pointer = key_to_pointer(key->path());
                QVERIFY2(form.fieldFor(pointer), pointer.c_str());
                ++fields;
            }
        }
        QVERIFY(fields > 50);
    }

    void fieldsRefuseWhatTheReaderRefuses() {
        DesignDocument document;
        QString error;
        QVERIFY(document.open(sample, &error));
        DesignForm form(&document);
        // The flight-path angle's bounds are exclusive (schema: above -90, below 90).
        auto* angle = qobject_cast<QuantityEdit*>(form.fieldFor("/entry/flight_path_angle_deg"));
        QVERIFY(angle);
        type(angle, "-90");
        QVERIFY(!angle->errorText().isEmpty());
        QCOMPARE(document.value("/entry/flight_path_angle_deg").get<double>(), -13.0);
        type(angle, "-89.5");
        QVERIFY(angle->errorText().isEmpty());
        QCOMPARE(document.value("/entry/flight_path_angle_deg").get<double>(), -89.5);
        // The marginal band is a fraction below one.
        auto* band = qobject_cast<QuantityEdit*>(form.fieldFor("/limits/marginal_band"));
        QVERIFY(band);
        type(band, "1");
        QVERIFY(!band->errorText().isEmpty());
        QVERIFY(document.value("/limits/marginal_band").is_null());
        QCOMPARE(band->placeholderText(), QString("0.1"));
    }

    void choicesComeFromTheCoresNameTables() {
        DesignDocument document;
        QString error;
        QVERIFY(document.open(sample, &error));
        DesignForm form(&document);
        auto* body = qobject_cast<QComboBox*>(form.fieldFor("/body"));
        QVERIFY(body);
        // Every preset, and a body of one's own.
        QCOMPARE(body->count(), static_cast<int>(body_preset_names().size()) + 1);
        QCOMPARE(body->currentText(), QString("Mars"));
        auto* canopy = qobject_cast<QComboBox*>(form.fieldFor("/parachute/type"));
        QVERIFY(canopy);
        QCOMPARE(canopy->count(), static_cast<int>(canopy_types().size()));
        QCOMPARE(canopy->currentText(), QString("disk-gap-band"));
    }

    void theDeceleratorTakesEveryTrigger() {
        DesignDocument document;
        QString error;
        QVERIFY(document.open(sample, &error));
        DesignForm form(&document);
        QVERIFY(!shown(form, "/decelerator/diameter_m"));
        QComboBox* presence = shape(form, "/decelerator#presence");
        QVERIFY(presence);
        presence->setCurrentIndex(1);
        QVERIFY(document.value("/decelerator") ==
                (Json{{"diameter_m", 6.0}, {"drag_coefficient", 1.3}, {"deploy_mach", 3.0}}));
        QVERIFY(document.design().has_value());
        QVERIFY(shown(form, "/decelerator/deploy_mach"));
        QVERIFY(!shown(form, "/decelerator/deploy_dynamic_pressure_Pa"));

        QComboBox* trigger = shape(form, "/decelerator#deploy trigger");
        QVERIFY(trigger);
        QCOMPARE(trigger->count(), 3);
        trigger->setCurrentIndex(1);
        QVERIFY(document.value("/decelerator/deploy_mach").is_null());
        QCOMPARE(document.value("/decelerator/deploy_dynamic_pressure_Pa").get<double>(), 2500.0);
        QVERIFY(!shown(form, "/decelerator/deploy_mach"));
        QVERIFY(shown(form, "/decelerator/deploy_dynamic_pressure_Pa"));
        QVERIFY(document.design().has_value());
        QCOMPARE(document.design()->decelerator->trigger, TriggerKind::dynamic_pressure);

        trigger->setCurrentIndex(2);
        QCOMPARE(document.value("/decelerator/deploy_altitude_m").get<double>(), 20000.0);
        QCOMPARE(document.design()->decelerator->trigger, TriggerKind::altitude);
        // The parachute's trigger is its own.
        QCOMPARE(document.value("/parachute/deploy_mach").get<double>(), 1.8);

        presence->setCurrentIndex(0);
        QVERIFY(document.value("/decelerator").is_null());
        QVERIFY(!shown(form, "/decelerator/deploy_altitude_m"));
    }

    void changingTheMethodKeepsOnlyItsKeys() {
        DesignDocument document;
        QString error;
        QVERIFY(document.open(sample, &error));
        DesignForm form(&document);
        QComboBox* method = shape(form, "/terminal/method");
        QVERIFY(method);
        QCOMPARE(method->currentIndex(), 0);  // retro
        QVERIFY(shown(form, "/terminal/thrust_N"));
        QVERIFY(!shown(form, "/terminal/release_height_m"));

        method->setCurrentIndex(3);  // none: land on the canopy
        QVERIFY(document.value("/terminal/method") == Json("none"));
        QVERIFY(document.value("/terminal/isp_s").is_null());
        QVERIFY(document.value("/terminal/thrust_to_weight").is_null());
        QCOMPARE(document.value("/terminal/touchdown_velocity_m_s").get<double>(), 2.0);
        QVERIFY(!shown(form, "/terminal/isp_s"));
        QVERIFY(shown(form, "/terminal/touchdown_velocity_m_s"));
        QVERIFY(document.design().has_value());

        method->setCurrentIndex(1);  // airbag: the engine's fallbacks come back
        QCOMPARE(document.value("/terminal/isp_s").get<double>(), 220.0);
        QCOMPARE(document.value("/terminal/thrust_to_weight").get<double>(), 2.5);
        QVERIFY(shown(form, "/terminal/release_height_m"));
        QVERIFY(document.design().has_value());

        document.undoStack()->undo();
        document.undoStack()->undo();
        QCOMPARE(document.value("/terminal/isp_s").get<double>(), 220.0);
        QVERIFY(document.value("/terminal/method") == Json("retro"));
        QCOMPARE(method->currentIndex(), 0);
    }

    void aDocumentNestedTooDeepIsRefusedNotWalked() {
        // Regression: the window parsed without the reader's nesting guard, and walking a
        // document nested a hundred thousand levels deep overflowed the stack.
        QTemporaryDir dir;
        const QString path = dir.filePath("deep.json");
        QFile file(path);
        QVERIFY(file.open(QIODevice::WriteOnly));
        const int depth = 100000;
        file.write(QByteArray("{\"name\": ") + QByteArray(depth, '[') + QByteArray(depth, ']') +
                   "}");
        file.close();
        DesignDocument document;
        QString error;
        QVERIFY(!document.open(path, &error));
        QVERIFY2(error.contains("nest more than 64 levels"), qPrintable(error));
    }

    void aDeviceOrAPipeIsRefusedNotReadOrWaitedOn() {
        // Regression: opening /dev/zero read without end, and a FIFO blocked the window.
        DesignDocument zero;
        QString error;
        QVERIFY(!zero.open(QStringLiteral("/dev/zero"), &error));
        QVERIFY2(error.contains("not a regular file (a device or a pipe)"), qPrintable(error));
        QTemporaryDir dir;
        const test::Fifo fifo(dir.filePath("design.fifo").toStdString());
        QVERIFY(fifo.ok());
        DesignDocument piped;
        bool opened = true;
        QVERIFY(test::returns_within(
            [&] { opened = piped.open(QString::fromStdString(fifo.path().string()), &error); },
            fifo));
        QVERIFY(!opened);
        QVERIFY2(error.contains("not a regular file"), qPrintable(error));
    }

    void aVersionBeyondThirtyTwoBitsIsANewerVersionNotOne() {
        // Regression: version 4294967297 was cut to 32 bits, read as 1, and opened.
        QTemporaryDir dir;
        const QString path = dir.filePath("future.json");
        QFile file(path);
        QVERIFY(file.open(QIODevice::WriteOnly));
        file.write(R"({"format": "descent-sizer/design", "version": 4294967297})");
        file.close();
        DesignDocument document;
        QString error;
        QVERIFY(!document.open(path, &error));
        QVERIFY2(error.contains("newer version"), qPrintable(error));
        QVERIFY2(error.contains("4294967297"), qPrintable(error));
    }

    void aPoweredDescentFromTheEntryTakesTheParachuteAwayAndBack() {
        DesignDocument document;
        QString error;
        QVERIFY(document.open(sample, &error));
        DesignForm form(&document);
        QComboBox* method = shape(form, "/terminal/method");
        method->setCurrentIndex(4);  // supersonic retro-propulsion from the entry
        QVERIFY(document.value("/terminal/method") == Json("supersonic-retro"));
        QVERIFY(document.value("/parachute").is_null());
        // One trigger of the group, not every one.
        QCOMPARE(document.value("/terminal/ignition_mach").get<double>(), 3.0);
        QVERIFY(document.value("/terminal/ignition_altitude_m").is_null());
        QVERIFY(shown(form, "/terminal/min_throttle"));
        QVERIFY(shown(form, "/terminal/drag_preservation"));
        QVERIFY(!shown(form, "/parachute/diameter_m"));
        QVERIFY(!form.findChild<QComboBox*>("/parachute/type")->isVisibleTo(&form));
        QVERIFY(document.design().has_value());

        method->setCurrentIndex(0);  // retro: under a parachute again
        QVERIFY(document.value("/parachute").is_object());
        QVERIFY(document.value("/terminal/ignition_mach").is_null());
        QVERIFY2(document.design().has_value(),
                 document.errors().empty() ? "" : document.errors().front().text().c_str());
        document.undoStack()->undo();
        document.undoStack()->undo();
        QCOMPARE(document.value("/parachute/diameter_m").get<double>(), 12.0);
    }

    void aTableAtmosphereStartsAsTheModelItReplacesAndIsEditedInTheWindow() {
        DesignDocument document;
        QString error;
        QVERIFY(document.open(sample, &error));
        DesignForm form(&document);
        form.show();
        QComboBox* model = shape(form, "/atmosphere/model");
        QVERIFY(model);
        model->setCurrentIndex(1);  // the body's standard model
        QVERIFY(document.value("/atmosphere/model") == Json("standard"));
        QVERIFY(document.value("/atmosphere/scale_height_m").is_null());
        QVERIFY(!shown(form, "/atmosphere/scale_height_m"));
        model->setCurrentIndex(0);  // exponential again: its keys at their fallbacks
        QCOMPARE(document.value("/atmosphere/scale_height_m").get<double>(), 11100.0);

        // A table: the exponential model's rows from the ground to the interface, in one edit.
        model->setCurrentIndex(2);
        QVERIFY(document.value("/atmosphere/model") == Json("table"));
        const Json rows = document.value("/atmosphere/rows");
        QVERIFY(rows.is_array());
        QVERIFY(rows.size() >= 20);
        QCOMPARE(rows.front()["altitude_m"].get<double>(), -1500.0);  // the site, below 0 m
        QCOMPARE(rows.back()["altitude_m"].get<double>(), 125000.0);  // the interface
        // 0.02 kg/m^3 at 0 m, 11.1 km scale height (the sample's): at the first row, 1500 m
        // below 0 m, rho = 0.02 exp(1500 / 11100) (relative 1e-12).
        const double expected = 0.02 * std::exp(1500.0 / 11100.0);
        QVERIFY(std::abs(rows.front()["density_kg_m3"].get<double>() / expected - 1.0) < 1e-12);
        QVERIFY(document.design().has_value());
        auto* table = form.findChild<AtmosphereTable*>("/atmosphere/rows");
        QVERIFY(table);
        QVERIFY(table->isVisibleTo(&form));
        QCOMPARE(table->tableWidget()->rowCount(), static_cast<int>(rows.size()));

        // A cell edited is one undoable edit the reader judges.
        table->tableWidget()->item(0, 2)->setText("215");
        QCOMPARE(document.value("/atmosphere/rows/0/temperature_K").get<double>(), 215.0);
        QVERIFY(document.design().has_value());
        // Rows pasted from a spreadsheet replace the table.
        // (The site is at -1500 m: a table must reach down to it.)
        QVERIFY(
            table->pasteRows("altitude\tdensity\ttemperature\n-2000\t0.015\t200\n"
                             "60000\t1e-4\t180\n130000\t2e-7\t150\n"));
        QCOMPARE(document.value("/atmosphere/rows").size(), std::size_t{3});
        QCOMPARE(document.value("/atmosphere/rows/1/density_kg_m3").get<double>(), 1e-4);
        QVERIFY(document.design().has_value());
        document.undoStack()->undo();
        QCOMPARE(document.value("/atmosphere/rows").size(), rows.size());

        // Another model: the table goes with the model, and the table hides.
        model->setCurrentIndex(0);
        QVERIFY(document.value("/atmosphere/rows").is_null());
        QVERIFY(!table->isVisibleTo(&form));
    }

    void aTableReadFromAFileIsCopiedInToEdit() {
        QTemporaryDir dir;
        QFile csv(dir.filePath("air.csv"));
        QVERIFY(csv.open(QIODevice::WriteOnly));
        csv.write(
            "altitude_m,density_kg_m3,temperature_K\n-2000,0.02,210\n50000,2e-4,180\n"
            "130000,1e-8,150\n");
        csv.close();
        QFile in(sample);
        QVERIFY(in.open(QIODevice::ReadOnly));
        Json json = Json::parse(in.readAll().toStdString());
        json["atmosphere"] = {{"model", "table"}, {"csv_file", "air.csv"}};
        QFile out(dir.filePath("design.json"));
        QVERIFY(out.open(QIODevice::WriteOnly));
        out.write(QByteArray::fromStdString(json.dump()));
        out.close();

        DesignDocument document;
        QString error;
        QVERIFY2(document.open(dir.filePath("design.json"), &error), qPrintable(error));
        QVERIFY(document.design().has_value());
        DesignForm form(&document);
        form.show();
        auto* table = form.findChild<AtmosphereTable*>("/atmosphere/rows");
        QVERIFY(table);
        QVERIFY(!table->tableWidget()->isVisibleTo(&form));  // the file's name instead
        QVERIFY(table->copyFileIn(&error));
        QVERIFY(document.value("/atmosphere/csv_file").is_null());
        QCOMPARE(document.value("/atmosphere/rows").size(), std::size_t{3});
        QCOMPARE(document.value("/atmosphere/rows/1/density_kg_m3").get<double>(), 2e-4);
        QVERIFY(table->tableWidget()->isVisibleTo(&form));
        QVERIFY(document.design().has_value());
        QCOMPARE(document.undoStack()->count(), 1);
    }

    void aCustomBodyStartsFromThePresetAndIsEditedFieldByField() {
        DesignDocument document;
        QString error;
        QVERIFY(document.open(sample, &error));
        DesignForm form(&document);
        form.show();
        auto* body = qobject_cast<QComboBox*>(form.fieldFor("/body"));
        QVERIFY(body);
        QVERIFY(!shown(form, "/body/radius_m"));
        body->setCurrentIndex(body->count() - 1);
        emit body->activated(body->count() - 1);  // as a user's choice
        const Json custom = document.value("/body");
        QVERIFY(custom.is_object());
        // Mars's constants copied (the preset's, body/presets.cpp).
        const Body mars = *body_preset("mars");
        QCOMPARE(custom["radius_m"].get<double>(), mars.radius_m);
        QCOMPARE(custom["mu_m3_s2"].get<double>(), mars.mu_m3_s2);
        QVERIFY(document.design().has_value());
        for (const char* key :
             {"/body/name", "/body/radius_m", "/body/mu_m3_s2", "/body/rotation_rad_s",
              "/body/gas_constant_J_kgK", "/body/gamma", "/body/sutton_graves_k"})
            QVERIFY2(shown(form, key), key);
        QCOMPARE(body->currentIndex(), body->count() - 1);  // no empty box

        auto* radius = qobject_cast<QuantityEdit*>(form.fieldFor("/body/radius_m"));
        QVERIFY(radius);
        type(radius, "3000 km");
        QCOMPARE(document.value("/body/radius_m").get<double>(), 3.0e6);
        type(radius, "-1");
        QVERIFY(radius->isRefused());
        QCOMPARE(document.value("/body/radius_m").get<double>(), 3.0e6);
        // Counted with the form's refused fields, so the window marks its results stale.
        QCOMPARE(form.refusedFields().size(), 1);
        QVERIFY2(form.refusedFields().front().startsWith(QStringLiteral("Body: Radius")),
                 qPrintable(form.refusedFields().front()));

        // A body of one's own with a preset's standard atmosphere: the atmosphere becomes a
        // table of itself in the same edit, so the design still reads and flies the same air.
        QVERIFY(document.open(
            QStringLiteral(DESCENT_SIZER_SAMPLES_DIR "/earth-return-capsule.json"), &error));
        QVERIFY(document.value("/atmosphere/model") == Json("standard"));
        const double interface = document.design()->entry.interface_altitude_m;
        body->setCurrentIndex(body->count() - 1);
        emit body->activated(body->count() - 1);
        QVERIFY(document.value("/body").is_object());
        QVERIFY(document.value("/atmosphere/model") == Json("table"));
        QVERIFY2(document.design().has_value(),
                 document.errors().empty() ? "" : document.errors().front().text().c_str());
        QCOMPARE(document.value("/atmosphere/rows").back()["altitude_m"].get<double>(), interface);
        QCOMPARE(document.undoStack()->count(), 1);

        body->setCurrentIndex(0);
        emit body->activated(0);
        QVERIFY(document.value("/body").is_string());
        QVERIFY(!shown(form, "/body/radius_m"));
        document.undoStack()->undo();
        QVERIFY(document.value("/body").is_object());
    }

    void sizingRequestsAndTheJettisonRuleSwitchShape() {
        DesignDocument document;
        QString error;
        QVERIFY(document.open(sample, &error));
        DesignForm form(&document);
        shape(form, "/parachute/diameter_m#sizing")->setCurrentIndex(1);
        QVERIFY(document.value("/parachute/diameter_m") ==
                (Json{{"size_for_velocity_m_s", 70.0}, {"at_height_above_site_m", 2000.0}}));
        QVERIFY(shown(form, "/parachute/diameter_m/at_height_above_site_m"));
        QVERIFY(!shown(form, "/parachute/diameter_m"));

        QVERIFY(shown(form, "/sequence/heat_shield_jettison_delay_s"));  // its default applies
        shape(form, "/sequence#heat-shield jettison rule")->setCurrentIndex(1);
        QCOMPARE(document.value("/sequence/heat_shield_jettison_dynamic_pressure_Pa").get<double>(),
                 100.0);
        QVERIFY(!shown(form, "/sequence/heat_shield_jettison_delay_s"));
        shape(form, "/sequence#heat-shield jettison rule")->setCurrentIndex(0);
        QVERIFY(document.value("/sequence/heat_shield_jettison_dynamic_pressure_Pa").is_null());
        QCOMPARE(document.value("/sequence/heat_shield_jettison_delay_s").get<double>(), 20.0);
        QVERIFY(document.design().has_value());
    }

    void theEntryStartsAtTheInterfaceFromTheApproachOrFromOrbit() {
        DesignDocument document;
        QString error;
        QVERIFY(document.open(sample, &error));
        DesignForm form(&document);
        QComboBox* start = shape(form, "/entry#start");
        QVERIFY(start);
        QCOMPARE(start->count(), 3);
        QCOMPARE(start->currentIndex(), 0);
        QVERIFY(shown(form, "/entry/velocity_m_s"));
        QVERIFY(!shown(form, "/entry/approach/v_infinity_m_s"));

        // From the approach: the speed and angle go, the approach comes with its fallbacks and
        // the first of its aims, and the inertial frame is the reader's.
        start->setCurrentIndex(1);
        QVERIFY(document.value("/entry/velocity_m_s").is_null());
        QVERIFY(document.value("/entry/flight_path_angle_deg").is_null());
        QVERIFY(document.value("/entry/approach") ==
                (Json{{"v_infinity_m_s", 3000.0}, {"periapsis_altitude_m", 20000.0}}));
        QVERIFY2(document.design().has_value(), "the approach reads");
        QCOMPARE(document.design()->entry.velocity_frame, VelocityFrame::inertial);
        QVERIFY(shown(form, "/entry/approach/v_infinity_m_s"));
        QVERIFY(shown(form, "/entry/approach/periapsis_altitude_m"));
        QVERIFY(!shown(form, "/entry/approach/flight_path_angle_deg"));
        QVERIFY(!shown(form, "/entry/velocity_m_s"));
        shape(form, "/entry#approach aim")->setCurrentIndex(1);
        QCOMPARE(document.value("/entry/approach/flight_path_angle_deg").get<double>(), -12.0);
        QVERIFY(document.design().has_value());

        // From orbit, then back to a state at the interface.
        start->setCurrentIndex(2);
        QVERIFY(document.value("/entry/approach").is_null());
        QVERIFY(shown(form, "/entry/orbit/isp_s"));
        QVERIFY2(document.design().has_value(), "the orbit reads");
        QVERIFY(document.design()->entry.orbit.has_value());
        start->setCurrentIndex(0);
        QVERIFY(document.value("/entry/orbit").is_null());
        QCOMPARE(document.value("/entry/velocity_m_s").get<double>(), 5600.0);
        QVERIFY(document.design().has_value());
    }

    void typicalValuesInTooltipsFollowTheBody() {
        // Regression: the velocity's tooltip said "typically 4500 to 7500 m/s" for every body.
        DesignDocument document;
        QString error;
        QVERIFY(document.open(sample, &error));
        DesignForm form(&document);
        QWidget* velocity = form.fieldFor("/entry/velocity_m_s");
        QVERIFY(velocity);
        QVERIFY2(velocity->toolTip().contains("typically 4500 to 7500"),
                 qPrintable(velocity->toolTip()));
        document.setValue("/body", Json("earth"), QStringLiteral("Set body"));
        QVERIFY2(velocity->toolTip().contains("typically 7500 to 12500"),
                 qPrintable(velocity->toolTip()));
        document.setValue("/body", Json("titan"), QStringLiteral("Set body"));
        QVERIFY2(velocity->toolTip().contains("typically 5500 to 7500"),
                 qPrintable(velocity->toolTip()));
    }

    void everyCheckPointsAtAField() {
        DesignDocument document;
        QString error;
        QVERIFY(document.open(sample, &error));
        DesignForm form(&document);
        for (const CheckField& check : check_fields()) {
            const std::string pointer = key_to_pointer(check.key);
            QVERIFY2(form.fieldFor(pointer), pointer.c_str());
        }
        // A deploy check names the Mach trigger; a design deploying on dynamic pressure is taken
        // to the trigger it gives.
        form.show();
        shape(form, "/parachute#deploy trigger")->setCurrentIndex(1);
        QVERIFY(form.focusField("/parachute/deploy_mach"));
        QTRY_VERIFY(form.fieldFor("/parachute/deploy_dynamic_pressure_Pa")->hasFocus());
    }
};

QTEST_MAIN(DesignFormTest)
#include "test_design_form.moc"
