//===- LeafPolicy.cpp - Which gates an analysis treats as leaves ----------===//
#include "revbound/analysis/LeafPolicy.h"

namespace revbound::analysis {

const char *granularityName(Granularity G) {
  switch (G) {
  case Granularity::Native:
    return "native";
  case Granularity::Primitive:
    return "primitive";
  }
  return "native";
}

bool LeafPolicy::isLeaf(const ir::GateDef &G) const {
  if (!G.hasBody())
    return true;
  if (Custom)
    return Custom(G);
  switch (Level) {
  case Granularity::Primitive:
    return false;
  case Granularity::Native:
    return G.Origin == ir::GateOrigin::StandardLibrary ||
           NativeNames.contains(G.Name);
  }
  return false;
}

} // namespace revbound::analysis
