//===- LeafDag.cpp - The dependency graph of a circuit's leaves -----------===//
#include "revbound/analysis/LeafDag.h"

#include <boost/graph/adjacency_list.hpp>
#include <boost/graph/dag_shortest_paths.hpp>

#include <functional>
#include <limits>

namespace revbound::analysis {

struct LeafDag::Graph {
  // Vertex 0 is a virtual source; vertex i + 1 is Nodes[i]. An edge weighs
  // what its target vertex weighs, so a path's weight is its layer count.
  using Type = boost::adjacency_list<boost::vecS, boost::vecS, boost::directedS,
                                     boost::no_property,
                                     boost::property<boost::edge_weight_t, int64_t>>;
  Type G;
};

LeafDag::LeafDag() : G(std::make_unique<Graph>()) {}
LeafDag::LeafDag(LeafDag &&) = default;
LeafDag::~LeafDag() = default;

namespace {

/// Expands top-level ops into leaf nodes through gate bodies.
class Expander {
public:
  Expander(const ir::Circuit &C, SummaryCache &Cache, uint64_t MaxNodes,
           std::vector<LeafNode> &Nodes)
      : C(C), Cache(Cache), MaxNodes(MaxNodes), Nodes(Nodes) {}

  /// False when the limit is passed.
  bool expandCall(uint32_t Top, ir::GateId G, llvm::ArrayRef<uint32_t> Wires,
                  llvm::ArrayRef<double> Params, llvm::SMLoc BodyLoc,
                  llvm::ArrayRef<uint32_t> CondBits) {
    if (Cache.isLeaf(G)) {
      if (Nodes.size() >= MaxNodes)
        return false;
      LeafNode N;
      N.TopOp = Top;
      N.Gate = G;
      N.Wires.assign(Wires.begin(), Wires.end());
      N.Wires.append(CondBits.begin(), CondBits.end());
      N.BodyLoc = BodyLoc;
      Nodes.push_back(std::move(N));
      return true;
    }
    const ir::GateDef &D = C.gate(G);
    llvm::SmallVector<uint32_t, 4> Mapped;
    llvm::SmallVector<double, 4> SubParams;
    for (const ir::BodyOp &B : D.Body) {
      Mapped.clear();
      for (uint32_t Local : B.Qubits)
        Mapped.push_back(Wires[Local]);
      if (B.IsBarrier) {
        if (Nodes.size() >= MaxNodes)
          return false;
        LeafNode N;
        N.TopOp = Top;
        N.Kind = ir::OpKind::Barrier;
        N.Wires.assign(Mapped.begin(), Mapped.end());
        N.BodyLoc = B.Loc;
        Nodes.push_back(std::move(N));
        continue;
      }
      SubParams.clear();
      for (const ir::ParamExpr &E : B.Params)
        SubParams.push_back(E.evaluate(Params));
      if (!expandCall(Top, B.Callee, Mapped, SubParams, B.Loc, CondBits))
        return false;
    }
    return true;
  }

private:
  const ir::Circuit &C;
  SummaryCache &Cache;
  uint64_t MaxNodes;
  std::vector<LeafNode> &Nodes;
};

} // namespace

llvm::Expected<std::optional<LeafDag>>
LeafDag::build(const ir::Circuit &C, SummaryCache &Cache, uint64_t MaxNodes) {
  LeafDag Dag;
  Expander X(C, Cache, MaxNodes, Dag.Nodes);
  llvm::SmallVector<uint32_t, 8> CondBits, Wires;
  for (uint32_t Top = 0; Top < C.Ops.size(); ++Top) {
    const ir::Op &O = C.Ops[Top];
    CondBits.clear();
    if (O.Cond != ir::NoCondition) {
      const ir::Register &R = C.CRegs[C.Conditions[O.Cond].CReg];
      for (uint32_t B = 0; B < R.Size; ++B)
        CondBits.push_back(C.NumQubits + R.Offset + B);
    }
    llvm::ArrayRef<uint32_t> W = C.wires(O);
    if (O.Kind == ir::OpKind::Gate) {
      if (!X.expandCall(Top, O.Gate, W, C.params(O), llvm::SMLoc(), CondBits))
        return std::nullopt;
      continue;
    }
    if (Dag.Nodes.size() >= MaxNodes)
      return std::nullopt;
    LeafNode N;
    N.TopOp = Top;
    N.Kind = O.Kind;
    N.Wires.assign(W.begin(), W.end());
    if (O.Kind == ir::OpKind::Measure)
      N.Wires[1] = C.NumQubits + W[1];
    N.Wires.append(CondBits.begin(), CondBits.end());
    Dag.Nodes.push_back(std::move(N));
  }

  auto &G = Dag.G->G;
  G = Graph::Type(Dag.Nodes.size() + 1);
  std::vector<uint32_t> Last(size_t(C.NumQubits) + C.NumClbits, 0);
  for (uint32_t I = 0; I < Dag.Nodes.size(); ++I) {
    const LeafNode &N = Dag.Nodes[I];
    int64_t Weight = N.Kind == ir::OpKind::Barrier ? 0 : 1;
    uint32_t V = I + 1;
    boost::add_edge(0, V, Weight, G);
    for (uint32_t W : N.Wires) {
      if (Last[W] == V) // a wire named twice, e.g. a condition bit measured
        continue;
      if (Last[W] != 0)
        boost::add_edge(Last[W], V, Weight, G);
      Last[W] = V;
    }
  }
  return std::optional<LeafDag>(std::move(Dag));
}

uint64_t LeafDag::longestPath(std::vector<uint32_t> &Path) const {
  const auto &G = this->G->G;
  size_t N = boost::num_vertices(G);
  std::vector<int64_t> Dist(N);
  std::vector<size_t> Pred(N);
  // Longest path in a DAG: the shortest-path relaxation with the comparison
  // reversed and minus infinity as "unreached".
  boost::dag_shortest_paths(
      G, 0,
      boost::distance_map(Dist.data())
          .predecessor_map(Pred.data())
          .distance_compare(std::greater<int64_t>())
          .distance_inf(std::numeric_limits<int64_t>::min())
          .distance_zero(int64_t(0)));
  size_t Best = 0;
  for (size_t V = 1; V < N; ++V)
    if (Dist[V] > Dist[Best])
      Best = V;
  Path.clear();
  for (size_t V = Best; V != 0; V = Pred[V])
    if (Nodes[V - 1].Kind != ir::OpKind::Barrier)
      Path.push_back(uint32_t(V - 1));
  std::reverse(Path.begin(), Path.end());
  return uint64_t(Dist[Best]);
}

} // namespace revbound::analysis
