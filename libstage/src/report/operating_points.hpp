// How the operating-point records of a bias point are reported, one
// description per device kind: its JSON keys under "devices", its table's
// columns, its CSV rows. The bias report iterates every kind's records
// through kDeviceRecords and never names a kind.
#pragma once

#include <span>
#include <string>
#include <string_view>
#include <tuple>

#include "stage/bias.hpp"

namespace stage::report {

// A word of a record (its kind, its region): JSON and, with a heading, the table.
template <class Point>
struct Word {
  std::string_view key;
  std::string_view heading;  // empty: JSON only
  std::string (*text)(const Point&);
};

// A number of a record: JSON, CSV and, with a heading, the table.
template <class Point>
struct Figure {
  std::string_view key;
  std::string_view heading;  // empty: JSON and CSV only
  std::string_view unit;
  double Point::*value;
};

template <class Point>
struct PointReport {
  std::string_view heading;  // the table's first column ("transistor")
  std::span<const Word<Point>> words;
  std::span<const Figure<Point>> figures;
};

extern const PointReport<BipolarOperatingPoint> kBipolarReport;
extern const PointReport<DiodeOperatingPoint> kDiodeReport;

// Every kind's records in a BiasResult, with their report.
inline const auto kDeviceRecords =
    std::make_tuple(std::make_pair(&BiasResult::bipolars, &kBipolarReport),
                    std::make_pair(&BiasResult::diodes, &kDiodeReport));

// Calls f(records, report) for every kind's records in `result`.
template <class F>
void for_each_device_kind(const BiasResult& result, F&& f) {
  std::apply([&](const auto&... kind) { (f(result.*(kind.first), *kind.second), ...); },
             kDeviceRecords);
}

}  // namespace stage::report
