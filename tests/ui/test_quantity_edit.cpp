// The unit-aware number field (ui/views/quantity_edit.hpp): what a user types is converted,
// checked against the field's range, and only a valid change reaches the design.

#include <QSignalSpy>
#include <QTest>

#include "views/quantity_edit.hpp"

namespace {

/// Clears the field, types `text` and presses Enter, as a user would.
void type(ds::QuantityEdit& edit, const QString& text) {
    edit.selectAll();
    QTest::keyClick(&edit, Qt::Key_Backspace);
    QTest::keyClicks(&edit, text);
    QTest::keyClick(&edit, Qt::Key_Return);
}

/// A diameter field: positive, at most 10 m, typically 2 to 5 m.
ds::QuantityRange diameterRange() {
    ds::QuantityRange range;
    range.minimum = 0.0;
    range.minimumExclusive = true;
    range.maximum = 10.0;
    range.typicalLow = 2.0;
    range.typicalHigh = 5.0;
    return range;
}

}  // namespace

class TestQuantityEdit : public QObject {
    Q_OBJECT
private slots:
    void convertsATypedUnitAndEmitsTheValue();
    void refusesAValueOutOfRange();
    void refusesAWrongUnitAndKeepsTheText();
    void setValueDoesNotEmit();
    void enterWithoutAnEditDoesNotEmit();
    void externalErrorShowsUntilTheNextValidEdit();
    void tooltipNamesTheTypicalRangeAndUnits();
};

void TestQuantityEdit::convertsATypedUnitAndEmitsTheValue() {
    ds::QuantityEdit edit(ds::Dimension::length, diameterRange());
    edit.setValue(2.6);
    QCOMPARE(edit.text(), "2.6 m");
    QSignalSpy edited(&edit, &ds::QuantityEdit::valueEdited);

    // international foot = 0.3048 m exactly (1959 international yard and pound agreement)
    type(edit, "15 ft");

    QCOMPARE(edited.count(), 1);
    QCOMPARE(edited.at(0).at(0).toDouble(), 4.572);
    QCOMPARE(edit.value().value_or(0.0), 4.572);
    QCOMPARE(edit.text(), "4.572 m");
    QVERIFY(edit.errorText().isEmpty());
    QCOMPARE(edit.property("invalid").toBool(), false);
}

void TestQuantityEdit::refusesAValueOutOfRange() {
    ds::QuantityEdit edit(ds::Dimension::length, diameterRange());
    edit.setValue(2.6);
    QSignalSpy edited(&edit, &ds::QuantityEdit::valueEdited);

    type(edit, "12");
    QCOMPARE(edit.errorText(), "must be at most 10 m");
    QCOMPARE(edit.toolTip(), "must be at most 10 m");
    QCOMPARE(edit.property("invalid").toBool(), true);
    QCOMPARE(edit.text(), "12");  // kept, so the user can correct it

    type(edit, "0 ft");
    QCOMPARE(edit.errorText(), "must be positive");

    QCOMPARE(edited.count(), 0);
    QCOMPARE(edit.value().value_or(0.0), 2.6);
}

void TestQuantityEdit::refusesAWrongUnitAndKeepsTheText() {
    ds::QuantityEdit edit(ds::Dimension::length, diameterRange());
    edit.setValue(2.6);
    QSignalSpy edited(&edit, &ds::QuantityEdit::valueEdited);

    type(edit, "3 kg");
    QCOMPARE(edit.errorText(), "'kg' is a mass, not a length");
    QCOMPARE(edit.text(), "3 kg");

    type(edit, "3");  // corrected: the error goes, the value comes
    QVERIFY(edit.errorText().isEmpty());
    QCOMPARE(edit.property("invalid").toBool(), false);
    QCOMPARE(edited.count(), 1);
    QCOMPARE(edit.text(), "3 m");
}

void TestQuantityEdit::setValueDoesNotEmit() {
    ds::QuantityEdit edit(ds::Dimension::angle, {});
    QSignalSpy edited(&edit, &ds::QuantityEdit::valueEdited);
    edit.setValue(-13.0);
    QCOMPARE(edit.text(), "-13 deg");
    edit.setValue(std::nullopt);
    QVERIFY(edit.text().isEmpty());
    QCOMPARE(edited.count(), 0);
}

void TestQuantityEdit::enterWithoutAnEditDoesNotEmit() {
    // 1234567.8 shows rounded to 6 digits; re-reading that text would change the value.
    ds::QuantityEdit edit(ds::Dimension::mass, {});
    edit.setValue(1234567.8);
    QCOMPARE(edit.text(), "1234570 kg");
    QSignalSpy edited(&edit, &ds::QuantityEdit::valueEdited);
    QTest::keyClick(&edit, Qt::Key_Return);
    emit edit.editingFinished();
    QCOMPARE(edited.count(), 0);
    QCOMPARE(edit.value().value_or(0.0), 1234567.8);

    type(edit, "1234567.8 kg");  // the same value typed out: no change, no signal
    QCOMPARE(edited.count(), 0);
}

void TestQuantityEdit::externalErrorShowsUntilTheNextValidEdit() {
    ds::QuantityEdit edit(ds::Dimension::length, diameterRange());
    edit.setValue(2.6);
    edit.setExternalError("aeroshell.diameter_m: exceeds the fairing");
    QCOMPARE(edit.toolTip(), "aeroshell.diameter_m: exceeds the fairing");
    QCOMPARE(edit.property("invalid").toBool(), true);

    type(edit, "abc");  // an invalid edit shows its own reason, the reader's stays behind it
    QCOMPARE(edit.toolTip(), "not a number");
    type(edit, "2.6 m");  // typed back unchanged: not an edit
    QCOMPARE(edit.toolTip(), "aeroshell.diameter_m: exceeds the fairing");

    type(edit, "2.5");
    QCOMPARE(edit.property("invalid").toBool(), false);
    QCOMPARE(edit.toolTip(), "typically 2 to 5 m; also accepts km, cm, mm, ft, kft, in, mi, nmi");

    edit.setExternalError("again");
    edit.setValue(3.0);  // a value from the model clears it too
    QCOMPARE(edit.property("invalid").toBool(), false);
}

void TestQuantityEdit::tooltipNamesTheTypicalRangeAndUnits() {
    ds::QuantityRange range;
    range.typicalLow = 0.3;
    range.typicalHigh = 0.9;
    ds::QuantityEdit fraction(ds::Dimension::dimensionless, range);
    QCOMPARE(fraction.toolTip(), "typically 0.3 to 0.9");
    fraction.setValue(0.5);
    QCOMPARE(fraction.text(), "0.5");
}

QTEST_MAIN(TestQuantityEdit)
#include "test_quantity_edit.moc"
