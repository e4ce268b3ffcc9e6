// Parsing and conversion of typed quantities (ui/units/quantity.hpp) against the exact
// definitions of the units. Doubles are compared with QCOMPARE, which for double uses
// qFuzzyCompare: equal to about 12 significant digits.

#include <QTest>

#include <string>

#include "units/quantity.hpp"

Q_DECLARE_METATYPE(ds::Dimension)

namespace {

double parsedValue(const QString& text, ds::Dimension dimension) {
    const auto parsed = ds::parseQuantity(text.toStdString(), dimension);
    if (!parsed.value) {
        qWarning("refused '%s': %s", qPrintable(text), parsed.error.c_str());
    }
    return parsed.value.value_or(-999.0);  // no case below expects -999
}

QString parseError(const QString& text, ds::Dimension dimension) {
    const auto parsed = ds::parseQuantity(text.toStdString(), dimension);
    return parsed.value ? QStringLiteral("(accepted)") : QString::fromStdString(parsed.error);
}

}  // namespace

class TestQuantity : public QObject {
    Q_OBJECT
private slots:
    void convertsToTheDocumentUnit_data();
    void convertsToTheDocumentUnit();
    void refusesWhatIsNotAQuantity_data();
    void refusesWhatIsNotAQuantity();
    void listsTheDocumentUnitFirst();
    void formatsWithoutTrailingZerosOrExponent_data();
    void formatsWithoutTrailingZerosOrExponent();
};

void TestQuantity::convertsToTheDocumentUnit_data() {
    QTest::addColumn<QString>("text");
    QTest::addColumn<ds::Dimension>("dimension");
    QTest::addColumn<double>("expected");
    using ds::Dimension;

    QTest::newRow("bare number is in the document's unit: 2.6 = 2.6 m")
        << "2.6" << Dimension::length << 2.6;
    QTest::newRow("spaces around and none before the unit: '  3.5km ' = 3500 m")
        << "  3.5km " << Dimension::length << 3500.0;
    QTest::newRow(
        "15 ft = 4.572 m (international foot = 0.3048 m exactly, 1959 international "
        "yard and pound agreement)")
        << "15 ft" << Dimension::length << 4.572;
    QTest::newRow("12 kft = 3657.6 m (1000 international feet of 0.3048 m)")
        << "12 kft" << Dimension::length << 3657.6;
    QTest::newRow(
        "1 nmi = 1852 m (international nautical mile, 1929 International "
        "Hydrographic Conference)")
        << "1 nmi" << Dimension::length << 1852.0;
    QTest::newRow(
        "300 lbm = 136.077711 kg (avoirdupois pound = 0.45359237 kg exactly, 1959 "
        "international yard and pound agreement)")
        << "300 lbm" << Dimension::mass << 136.077711;
    QTest::newRow("5.6 km/s = 5600 m/s") << "5.6 km/s" << Dimension::velocity << 5600.0;
    QTest::newRow("10 kn = 5.1444... m/s (knot = 1852 m per 3600 s)")
        << "10 kn" << Dimension::velocity << 18520.0 / 3600.0;
    QTest::newRow("-13 deg stays -13 deg (the document's angles are in degrees)")
        << "-13 deg" << Dimension::angle << -13.0;
    QTest::newRow("0.5 rad = 28.64788975654116 deg (180/pi deg per rad)")
        << "0.5 rad" << Dimension::angle << 28.64788975654116;
    QTest::newRow("45\u00b0 = 45 deg (degree sign)") << "45\u00b0" << Dimension::angle << 45.0;
    QTest::newRow("210 K = 210 K") << "210 K" << Dimension::temperature << 210.0;
    QTest::newRow("-63.15 C = 210 K (0 degC = 273.15 K, ITS-90)")
        << "-63.15 C" << Dimension::temperature << 210.0;
    QTest::newRow("-81.67 F = 210 K (K = (degF + 459.67) * 5/9)")
        << "-81.67 degF" << Dimension::temperature << 210.0;
    QTest::newRow("1 atm = 101325 Pa (standard atmosphere, 10th CGPM 1954)")
        << "1 atm" << Dimension::pressure << 101325.0;
    QTest::newRow(
        "1 psi = 6894.757293168361 Pa (lbf = 0.45359237 kg * 9.80665 m/s^2 "
        "on a square inch of 0.0254 m)")
        << "1 psi" << Dimension::pressure << 6894.757293168361;
    QTest::newRow("1 slug/ft^3 = 515.3788183931961 kg/m^3 (slug = lbf s^2/ft)")
        << "1 slug/ft^3" << Dimension::density << 515.3788183931961;
    QTest::newRow(
        "1 BTU/ft^2/s = 1.1356526682226975 W/cm^2 (International Table BTU = "
        "1055.05585262 J)")
        << "1 BTU/ft^2/s" << Dimension::heat_flux << 1.1356526682226975;
    QTest::newRow("100 kW/m^2 = 10 W/cm^2") << "100 kW/m^2" << Dimension::heat_flux << 10.0;
    QTest::newRow("9.80665 m/s^2 = 1 g (standard gravity, 3rd CGPM 1901)")
        << "9.80665 m/s^2" << Dimension::acceleration << 1.0;
    QTest::newRow("60 rpm = 2 pi rad/s")
        << "60 rpm" << Dimension::angular_rate << 6.283185307179586;
    QTest::newRow("2.5 min = 150 s") << "2.5 min" << Dimension::time << 150.0;
}

void TestQuantity::convertsToTheDocumentUnit() {
    QFETCH(QString, text);
    QFETCH(ds::Dimension, dimension);
    QFETCH(double, expected);
    QCOMPARE(parsedValue(text, dimension), expected);
}

void TestQuantity::refusesWhatIsNotAQuantity_data() {
    QTest::addColumn<QString>("text");
    QTest::addColumn<ds::Dimension>("dimension");
    QTest::addColumn<QString>("error");
    using ds::Dimension;

    QTest::newRow("letters") << "abc" << Dimension::length << "not a number";
    QTest::newRow("empty") << "   " << Dimension::length << "not a number";
    QTest::newRow("decimal comma (reading is independent of the locale)")
        << "2,5 m" << Dimension::length << "not a number: use a point as the decimal separator";
    QTest::newRow("a mass for a length")
        << "3 kg" << Dimension::length << "'kg' is a mass, not a length";
    QTest::newRow("'g' names two dimensions")
        << "3 g" << Dimension::velocity << "'g' is a mass or an acceleration, not a velocity";
    QTest::newRow("nan") << "nan" << Dimension::length << "must be finite";
    QTest::newRow("inf") << "-inf m" << Dimension::length << "must be finite";
    QTest::newRow("overflow after conversion")
        << "1e308 km" << Dimension::length << "must be finite";
    QTest::newRow("unknown unit lists the accepted ones")
        << "4.5 furlongs" << Dimension::length
        << "unknown unit 'furlongs' for a length: use m, km, cm, mm, ft, kft, in, mi, nmi";
    QTest::newRow("symbols are case-sensitive") << "4.5 M" << Dimension::length
                                                << "unknown unit 'M' for a length: use m, km, cm, "
                                                   "mm, ft, kft, in, mi, nmi";
    QTest::newRow("a bare number takes no unit")
        << "50 %" << Dimension::dimensionless << "'%' is not expected: type a bare number";
}

void TestQuantity::refusesWhatIsNotAQuantity() {
    QFETCH(QString, text);
    QFETCH(ds::Dimension, dimension);
    QFETCH(QString, error);
    QCOMPARE(parseError(text, dimension), error);
}

void TestQuantity::listsTheDocumentUnitFirst() {
    QCOMPARE(QString::fromStdString(std::string(ds::siUnit(ds::Dimension::length))), "m");
    QCOMPARE(QString::fromStdString(std::string(ds::siUnit(ds::Dimension::heat_flux))), "W/cm^2");
    QCOMPARE(QString::fromStdString(std::string(ds::siUnit(ds::Dimension::acceleration))), "g");
    QVERIFY(ds::siUnit(ds::Dimension::dimensionless).empty());
    QCOMPARE(ds::unitsOf(ds::Dimension::length).size(), std::size_t{9});
}

void TestQuantity::formatsWithoutTrailingZerosOrExponent_data() {
    QTest::addColumn<double>("value");
    QTest::addColumn<QString>("text");

    QTest::newRow("4.572") << 4.572 << "4.572";
    QTest::newRow("integer") << 100.0 << "100";
    QTest::newRow("binary noise rounded: 0.1 + 0.2") << 0.1 + 0.2 << "0.3";
    QTest::newRow("negative zero") << -0.0 << "0";
    QTest::newRow("negative") << -13.5 << "-13.5";
    QTest::newRow("large, 6 significant digits, no exponent") << 1234567.8 << "1234570";
    QTest::newRow("small, 6 significant digits, no exponent") << 0.00012345678 << "0.000123457";
    QTest::newRow("below 1e-4 uses an exponent") << 0.00001 << "1e-05";
    QTest::newRow("from 1e7 uses an exponent") << 25000000.0 << "2.5e+07";
}

void TestQuantity::formatsWithoutTrailingZerosOrExponent() {
    QFETCH(double, value);
    QFETCH(QString, text);
    QCOMPARE(QString::fromStdString(ds::formatQuantity(value)), text);
}

QTEST_MAIN(TestQuantity)
#include "test_quantity.moc"
