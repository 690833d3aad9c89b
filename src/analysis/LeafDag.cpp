//===- LeafDag.cpp - The dependency graph of a circuit's leaves -----------===//
#include "revbound/analysis/LeafDag.h"

#include <boost/graph/compressed_sparse_row_graph.hpp>
#include <boost/graph/dag_shortest_paths.hpp>

#include <algorithm>
#include <functional>
#include <limits>

namespace revbound::analysis {

/// An edge's property: its target vertex's weight in layers.
struct LeafEdge {
  int64_t Weight = 0;
};

struct LeafDag::Graph {
  // Vertex 0 is a virtual source; vertex i + 1 is Nodes[i]. An edge weighs
  // what its target vertex weighs, so a path's weight is its layer count.
  // Compressed rows: the edges are known before the graph is made, and two
  // arrays cost far less than a vector of out-edges per vertex (whose
  // allocations took most of the time of a 200,000-leaf graph).
  using Type = boost::compressed_sparse_row_graph<boost::directedS,
                                                  boost::no_property, LeafEdge>;
  template <typename EdgeIt, typename WeightIt>
  Graph(EdgeIt Begin, EdgeIt End, WeightIt Weights, size_t NumVertices)
      : G(boost::edges_are_unsorted_multi_pass, Begin, End, Weights,
          NumVertices) {}
  Type G;
};

LeafDag::LeafDag() = default;
LeafDag::LeafDag(LeafDag &&) = default;
LeafDag &LeafDag::operator=(LeafDag &&) = default;
LeafDag::~LeafDag() = default;

namespace {

/// Expands top-level ops into vertices through gate bodies and records the
/// edges: from the previous vertex on each wire (vertex ids are 1-based).
class Builder {
public:
  Builder(const ir::Circuit &C, SummaryCache &Cache, uint64_t MaxNodes,
          std::vector<LeafNode> &Nodes)
      : C(C), Cache(Cache), MaxNodes(MaxNodes), Nodes(Nodes),
        Last(size_t(C.NumQubits) + C.NumClbits, 0), Readers(C.NumClbits) {}

  std::vector<std::pair<uint32_t, uint32_t>> Edges;
  std::vector<LeafEdge> Weights;

  /// Adds a vertex on `N.Wires` that also waits for the vertices `ExtraIn`
  /// and reads the bits `Reads`. A bit among its wires is written: the
  /// vertex waits for the bit's last writer and for every reader since.
  bool add(LeafNode N, llvm::ArrayRef<uint32_t> ExtraIn = {},
           llvm::ArrayRef<uint32_t> Reads = {}) {
    if (Nodes.size() >= MaxNodes)
      return false;
    uint32_t V = uint32_t(Nodes.size() + 1);
    int64_t Weight = N.Kind == ir::OpKind::Barrier ? 0 : 1;
    auto edge = [&](uint32_t From) {
      if (From == 0 || From == V)
        return;
      Edges.push_back({From, V});
      Weights.push_back({Weight});
    };
    Edges.push_back({0, V});
    Weights.push_back({Weight});
    for (uint32_t From : ExtraIn)
      edge(From);
    for (uint32_t B : Reads) {
      edge(Last[B]);
      Readers[B - C.NumQubits].push_back(V);
    }
    for (uint32_t W : N.Wires) {
      edge(Last[W]);
      if (W >= C.NumQubits) {
        for (uint32_t R : Readers[W - C.NumQubits])
          edge(R);
        Readers[W - C.NumQubits].clear();
      }
      Last[W] = V;
    }
    Nodes.push_back(std::move(N));
    return true;
  }

  bool expandCall(uint32_t Top, ir::GateId G, llvm::ArrayRef<uint32_t> Wires,
                  llvm::ArrayRef<double> Params, llvm::SMLoc BodyLoc) {
    if (Cache.isLeaf(G)) {
      LeafNode N;
      N.TopOp = Top;
      N.Gate = G;
      N.Wires.assign(Wires.begin(), Wires.end());
      N.BodyLoc = BodyLoc;
      return add(std::move(N));
    }
    llvm::SmallVector<uint32_t, 4> Mapped;
    llvm::SmallVector<double, 4> SubParams;
    for (const ir::BodyOp &B : C.gate(G).Body) {
      Mapped.clear();
      for (uint32_t Local : B.Qubits)
        Mapped.push_back(Wires[Local]);
      if (B.IsBarrier) {
        LeafNode N;
        N.TopOp = Top;
        N.Kind = ir::OpKind::Barrier;
        N.Wires.assign(Mapped.begin(), Mapped.end());
        N.BodyLoc = B.Loc;
        if (!add(std::move(N)))
          return false;
        continue;
      }
      SubParams.clear();
      for (const ir::ParamExpr &E : B.Params)
        SubParams.push_back(E.evaluate(Params));
      if (!expandCall(Top, B.Callee, Mapped, SubParams, B.Loc))
        return false;
    }
    return true;
  }

  /// A conditional call of a non-leaf gate: each argument first waits for
  /// the condition bits, then the body runs as usual, and the bits may be
  /// measured again once every argument is done (Schedule.h's semantics).
  bool expandConditionalCall(uint32_t Top, const ir::Op &O,
                             llvm::ArrayRef<uint32_t> CondBits) {
    llvm::ArrayRef<uint32_t> Args = C.wires(O);
    for (uint32_t A : Args) {
      LeafNode Wait;
      Wait.TopOp = Top;
      Wait.Kind = ir::OpKind::Barrier;
      Wait.Wires.push_back(A);
      llvm::SmallVector<uint32_t, 8> CondIn;
      for (uint32_t B : CondBits)
        CondIn.push_back(Last[B]);
      if (!add(std::move(Wait), CondIn))
        return false;
    }
    if (!expandCall(Top, O.Gate, Args, C.params(O), llvm::SMLoc()))
      return false;
    llvm::SmallVector<uint32_t, 8> Done;
    for (uint32_t A : Args)
      Done.push_back(Last[A]);
    LeafNode Join;
    Join.TopOp = Top;
    Join.Kind = ir::OpKind::Barrier;
    return add(std::move(Join), Done, CondBits);
  }

private:
  const ir::Circuit &C;
  SummaryCache &Cache;
  uint64_t MaxNodes;
  std::vector<LeafNode> &Nodes;
  std::vector<uint32_t> Last; // last vertex writing each wire, 0 for none
  std::vector<std::vector<uint32_t>> Readers; // per bit, since its last write
};

} // namespace

llvm::Expected<std::optional<LeafDag>>
LeafDag::build(const ir::Circuit &C, SummaryCache &Cache, uint64_t MaxNodes) {
  LeafDag Dag;
  Builder B(C, Cache, MaxNodes, Dag.Nodes);
  // A flat circuit has one vertex per op and an edge from the source and
  // one per wire into each: growing the arrays by doubling would copy them
  // about twice over. The bound keeps a huge file's reservation in check.
  size_t Vertices = std::min<uint64_t>(C.Ops.size(), MaxNodes);
  Dag.Nodes.reserve(Vertices);
  size_t Edges = Vertices + std::min<uint64_t>(C.Wires.size(), 4 * Vertices);
  B.Edges.reserve(Edges);
  B.Weights.reserve(Edges);
  llvm::SmallVector<uint32_t, 8> CondBits;
  for (uint32_t Top = 0; Top < C.Ops.size(); ++Top) {
    const ir::Op &O = C.Ops[Top];
    CondBits.clear();
    if (O.Cond != ir::NoCondition) {
      const ir::Register &R = C.CRegs[C.Conditions[O.Cond].CReg];
      for (uint32_t Bit = 0; Bit < R.Size; ++Bit)
        CondBits.push_back(C.NumQubits + R.Offset + Bit);
    }
    llvm::ArrayRef<uint32_t> W = C.wires(O);
    bool Leaf = O.Kind != ir::OpKind::Gate || Cache.isLeaf(O.Gate);
    bool Ok = true;
    if (!Leaf && CondBits.empty()) {
      Ok = B.expandCall(Top, O.Gate, W, C.params(O), llvm::SMLoc());
    } else if (!Leaf) {
      Ok = B.expandConditionalCall(Top, O, CondBits);
    } else {
      // A leaf, measure, reset or barrier; it reads its condition bits.
      LeafNode N;
      N.TopOp = Top;
      N.Kind = O.Kind;
      N.Gate = O.Gate;
      N.Wires.assign(W.begin(), W.end());
      if (O.Kind == ir::OpKind::Measure)
        N.Wires[1] = C.NumQubits + W[1];
      Ok = B.add(std::move(N), {}, CondBits);
    }
    if (!Ok)
      return std::nullopt;
  }
  Dag.G = std::make_unique<Graph>(B.Edges.begin(), B.Edges.end(),
                                  B.Weights.begin(), Dag.Nodes.size() + 1);
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
      boost::weight_map(boost::get(&LeafEdge::Weight, G))
          .distance_map(Dist.data())
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
