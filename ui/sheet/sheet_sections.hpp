#pragma once

#include <QString>

#include "design/design.hpp"
#include "results/results.hpp"

namespace ds {
struct StudyOutcome;
}

namespace ds::sheet {

/// The sheet's sections of the design and its results, each an HTML <section>.
QString designSection(const Design& design, const Results& results);
/// The caution every sheet carries, then the results' other notes.
QString cautionSection(const Results& results);
QString keyFiguresSection(const Results& results);
/// Where the entry starts, for a design entering from an approach or an orbit (empty
/// otherwise): the conic's figures, the deorbit burn, the interface state in both frames.
QString entryStartSection(const Results& results);
QString massSection(const Results& results);
QString timelineSection(const Design& design, const Results& results);
QString checksSection(const Results& results);
/// For the first page: the checks that fail or are marginal, or that every check passes.
QString reviewChecksSection(const Results& results);
/// The inputs as the form groups and labels them, with their units; a value the design leaves
/// to its default is marked; the parts read by hand (the body, tables, mass items,
/// dispersions) row by row. An appendix: it starts a new page.
QString inputsAppendix(const Design& design);
/// The reference cases of `descent-sizer verify` (verification/reference_cases), run now: each
/// with its source, the expected and computed values and their agreement. An appendix.
QString verificationAppendix();
/// Where the lander comes down: latitude, longitude, downrange and crossrange from the entry
/// point, and with a target site the miss and its parts; with a dispersion study (`trade` may
/// be null) its landing ellipse's figures.
QString landingSection(const Design& design, const Results& results, const StudyOutcome* trade);

}  // namespace ds::sheet
