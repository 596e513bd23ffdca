#pragma once
// A layered drawing layout of a network's graph, so a renderer only has to scale and draw:
// (1) layers by longest path from the roots, so every arrow points to a later layer;
// (2) arrows spanning several layers get virtual points in the layers between;
// (3) the order within each layer by repeated barycenter sweeps (down, then up), keeping the
//     order with fewest crossings between adjacent layers.
// Sugiyama, Tagawa & Toda 1981, Methods for visual understanding of hierarchical system
// structures, IEEE Trans. Systems, Man and Cybernetics 11:109–125 (steps and barycenter method).

#include <cstddef>
#include <vector>

#include "core/models/network/variable_elimination.hpp"

namespace counterpoise::models::network {

struct NodePlacement {
  std::size_t layer = 0;     // 0 for roots; a child is always in a later layer than its parents
  std::size_t position = 0;  // slot within the layer, 0 = leftmost; virtual points take slots too
};

// One arrow parent -> child, with the slot it passes through in each layer between them.
struct EdgeRoute {
  std::size_t parent = 0;
  std::size_t child = 0;
  std::vector<NodePlacement> bends;  // one per layer strictly between, top to bottom
};

struct NetworkLayout {
  std::vector<NodePlacement> nodes;  // indexed like the network's nodes
  std::vector<EdgeRoute> edges;      // in node order, each node's parents in their given order
  std::vector<std::size_t> layer_widths;  // slots per layer (nodes plus virtual points)
  std::size_t crossings = 0;              // arrow crossings between adjacent layers in this order
};

// The layout of `dag` (deterministic: ties keep the order of the nodes in the file).
NetworkLayout layered_layout(const Dag& dag);

}  // namespace counterpoise::models::network
