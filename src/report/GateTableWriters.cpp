//===- GateTableWriters.cpp - The gate table as text and as JSON ----------===//
#include "revbound/report/GateTable.h"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <numbers>

namespace revbound::report {

using Json = nlohmann::ordered_json;

static const char *originName(ir::GateOrigin O) {
  switch (O) {
  case ir::GateOrigin::Builtin:
    return "builtin";
  case ir::GateOrigin::StandardLibrary:
    return "library";
  case ir::GateOrigin::User:
    return "user";
  case ir::GateOrigin::Opaque:
    return "opaque";
  }
  return "user";
}

//===----------------------------------------------------------------------===//
// JSON
//===----------------------------------------------------------------------===//

template <typename T> static Json orNull(const std::optional<T> &V) {
  return V ? Json(*V) : Json(nullptr);
}

static Json rowJson(const GateRow &R) {
  Json J;
  J["name"] = R.Name;
  J["origin"] = originName(R.Origin);
  J["replaced"] = R.Replaced;
  J["defined_at"] =
      R.File.empty()
          ? Json(nullptr)
          : Json{{"file", R.File}, {"line", R.Line}, {"column", R.Column}};
  J["qubits"] = R.Qubits;
  J["params"] = R.Params;
  J["values"] = R.Values.empty() ? Json(nullptr) : Json(R.Values);
  J["evaluation"] = evaluationName(R.Eval);
  J["class"] = R.Class ? Json(ir::unitaryClassName(*R.Class)) : Json(nullptr);
  J["angle_rad"] = orNull(R.AngleRad);
  J["orthogonal"] = orNull(R.Orthogonal);
  J["action_Js"] = orNull(R.ActionJs);
  J["note"] = R.Note.empty() ? Json(nullptr) : Json(R.Note);
  J["primitive"] = {{"U", R.PrimitiveU},
                    {"CX", R.PrimitiveCX},
                    {"opaque", R.PrimitiveOpaque}};
  return J;
}

std::string writeGateTableJson(const GateTable &T) {
  Json Root;
  Root["schema"] = GateTableSchemaVersion;
  Root["file"] = T.File.empty() ? Json(nullptr) : Json(T.File);
  Root["library"] = T.Library;
  Root["library_included"] = T.LibraryIncluded;
  Json Rows = Json::array();
  for (const GateRow &R : T.Rows)
    Rows.push_back(rowJson(R));
  Root["gates"] = std::move(Rows);
  // Names come from files that need not be UTF-8.
  return Root.dump(2, ' ', false, Json::error_handler_t::replace) + "\n";
}

//===----------------------------------------------------------------------===//
// Text
//===----------------------------------------------------------------------===//

/// "pi/8", "3pi/8" or "0" when the angle is n pi / d for d <= 16 (within
/// 1e-9), so that the textbook angles read as they are written.
static std::string piMultiple(double Angle) {
  for (int D = 1; D <= 16; ++D) {
    double N = std::round(Angle * D / std::numbers::pi);
    if (std::fabs(Angle - N * std::numbers::pi / D) > 1e-9)
      continue;
    if (N == 0)
      return "0";
    std::string Num = N == 1 ? "pi" : fmt::format("{}pi", N);
    return D == 1 ? Num : fmt::format("{}/{}", Num, D);
  }
  return "";
}

static std::string angleText(const GateRow &R) {
  if (R.AngleRad) {
    std::string Exact = piMultiple(*R.AngleRad);
    std::string Num = fmt::format("{:.6f}", *R.AngleRad);
    return Exact.empty() ? Num : fmt::format("{} = {}", Num, Exact);
  }
  return R.Eval == Evaluation::Generic ? "depends" : "-";
}

static std::string classText(const GateRow &R) {
  if (!R.Class)
    return "-";
  std::string Name = ir::unitaryClassName(*R.Class);
  return R.Eval == Evaluation::Generic ? Name + " (generic)" : Name;
}

static std::string paramsText(const GateRow &R) {
  std::string Out;
  for (size_t I = 0; I < R.Params.size(); ++I) {
    if (I)
      Out += ",";
    Out += R.Params[I];
    if (!R.Values.empty())
      Out += fmt::format("={:.6g}", R.Values[I]);
  }
  return Out.empty() ? "-" : Out;
}

static std::vector<std::string> cells(const GateRow &R) {
  std::string From = originName(R.Origin);
  if (R.Replaced)
    From += " (replaced)";
  std::string Orth = !R.Orthogonal ? "-" : *R.Orthogonal ? "yes" : "no";
  std::string Action = !R.ActionJs        ? "-"
                       : *R.ActionJs == 0 ? "0"
                                          : fmt::format("{:.4e}", *R.ActionJs);
  std::string U = std::to_string(R.PrimitiveU);
  std::string CX = std::to_string(R.PrimitiveCX);
  if (R.PrimitiveOpaque)
    CX += fmt::format(" (+{} opaque)", R.PrimitiveOpaque);
  return {R.Name,
          From,
          std::to_string(R.Qubits),
          paramsText(R),
          classText(R),
          angleText(R),
          Orth,
          Action,
          U,
          CX};
}

std::string writeGateTableText(const GateTable &T) {
  std::string Out;
  if (T.File.empty())
    Out += fmt::format("gate library {}\n\n", T.Library);
  else
    Out += fmt::format("gates of {} and library {}{}\n\n", T.File, T.Library,
                       T.LibraryIncluded ? "" : " (not included by the file)");
  std::vector<std::vector<std::string>> Table = {
      {"name", "from", "qubits", "params", "class", "angle (rad)", "orthogonal",
       "action (J s)", "U", "CX"}};
  for (const GateRow &R : T.Rows)
    Table.push_back(cells(R));
  std::vector<size_t> Width(Table[0].size(), 0);
  for (const auto &Line : Table)
    for (size_t I = 0; I < Line.size(); ++I)
      Width[I] = std::max(Width[I], Line[I].size());
  for (const auto &Line : Table) {
    std::string Text;
    for (size_t I = 0; I < Line.size(); ++I)
      Text += fmt::format("{:<{}}", Line[I],
                          I + 1 < Line.size() ? Width[I] + 2 : 0);
    Out += Text + "\n";
  }
  bool Generic = false;
  std::string Notes;
  for (const GateRow &R : T.Rows) {
    Generic |= R.Eval == Evaluation::Generic;
    if (R.Eval == Evaluation::None)
      Notes += fmt::format("  {}: {}\n", R.Name, R.Note);
  }
  if (!Notes.empty())
    Out += "\nno unitary:\n" + Notes;
  Out +=
      "\nangle: the largest angle L(U) = max arccos|<psi|U|psi>| the gate "
      "moves "
      "a state; orthogonal: L = pi/2\n"
      "action: pi hbar alpha(cos^2 L) / 2, so one application takes at least "
      "action / E at mean energy E\n";
  if (Generic)
    Out += "generic: class for generic parameter values; the angle depends on "
           "them (give values with --params NAME=v1,v2,...)\n";
  return Out;
}

} // namespace revbound::report
