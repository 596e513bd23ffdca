#include "core/models/network/network_layout.hpp"

#include <algorithm>
#include <numeric>

namespace counterpoise::models::network {

namespace {

// The proper layered graph: real nodes 0..n-1, then virtual points; arrows only between
// adjacent layers.
struct Proper {
  std::vector<std::size_t> layer;
  std::vector<std::vector<std::size_t>> up, down;  // neighbours in the previous / next layer
};

std::size_t count_crossings(const Proper& g, const std::vector<std::vector<std::size_t>>& layers,
                            const std::vector<std::size_t>& slot) {
  std::size_t crossings = 0;
  for (std::size_t l = 0; l + 1 < layers.size(); ++l) {
    std::vector<std::pair<std::size_t, std::size_t>> arrows;
    for (auto u : layers[l])
      for (auto v : g.down[u]) arrows.emplace_back(slot[u], slot[v]);
    for (std::size_t i = 0; i < arrows.size(); ++i)
      for (std::size_t j = i + 1; j < arrows.size(); ++j)
        if ((arrows[i].first < arrows[j].first && arrows[i].second > arrows[j].second) ||
            (arrows[i].first > arrows[j].first && arrows[i].second < arrows[j].second))
          ++crossings;
  }
  return crossings;
}

// Reorders one layer by the mean slot of each vertex's neighbours in the fixed layer; vertices
// without neighbours keep their slot (stable sort on the barycenter).
void barycenter_sort(std::vector<std::size_t>& layer, const std::vector<std::vector<std::size_t>>& neighbours,
                     std::vector<std::size_t>& slot) {
  std::vector<std::pair<double, std::size_t>> keyed;
  for (auto v : layer) {
    double key = static_cast<double>(slot[v]);
    if (!neighbours[v].empty()) {
      double sum = 0.0;
      for (auto u : neighbours[v]) sum += static_cast<double>(slot[u]);
      key = sum / static_cast<double>(neighbours[v].size());
    }
    keyed.emplace_back(key, v);
  }
  std::stable_sort(keyed.begin(), keyed.end(), [](const auto& a, const auto& b) { return a.first < b.first; });
  for (std::size_t i = 0; i < keyed.size(); ++i) {
    layer[i] = keyed[i].second;
    slot[layer[i]] = i;
  }
}

}  // namespace

NetworkLayout layered_layout(const Dag& dag) {
  const std::size_t n = dag.size();
  NetworkLayout layout;
  // Longest-path layers: a node's layer is one more than its deepest parent's (the graph is
  // acyclic, so repeated relaxation settles within n passes).
  std::vector<std::size_t> layer(n, 0);
  for (std::size_t pass = 0; pass < n; ++pass) {
    bool changed = false;
    for (std::size_t v = 0; v < n; ++v)
      for (auto p : dag[v].parents)
        if (layer[v] < layer[p] + 1) {
          layer[v] = layer[p] + 1;
          changed = true;
        }
    if (!changed) break;
  }
  Proper g{layer, std::vector<std::vector<std::size_t>>(n), std::vector<std::vector<std::size_t>>(n)};
  std::vector<std::vector<std::size_t>> chains;  // per edge: the virtual points, top to bottom
  for (std::size_t v = 0; v < n; ++v) {
    for (auto p : dag[v].parents) {
      std::vector<std::size_t> chain;
      std::size_t previous = p;
      for (std::size_t l = layer[p] + 1; l < layer[v]; ++l) {
        const std::size_t point = g.layer.size();
        g.layer.push_back(l);
        g.up.push_back({previous});
        g.down.push_back({});
        g.down[previous].push_back(point);
        chain.push_back(point);
        previous = point;
      }
      g.down[previous].push_back(v);
      g.up[v].push_back(previous);
      layout.edges.push_back({p, v, {}});
      chains.push_back(std::move(chain));
    }
  }
  const std::size_t layer_count = n ? *std::max_element(layer.begin(), layer.end()) + 1 : 0;
  std::vector<std::vector<std::size_t>> layers(layer_count);
  for (std::size_t v = 0; v < g.layer.size(); ++v) layers[g.layer[v]].push_back(v);
  std::vector<std::size_t> slot(g.layer.size());
  for (const auto& l : layers)
    for (std::size_t i = 0; i < l.size(); ++i) slot[l[i]] = i;
  auto best_layers = layers;
  auto best_slot = slot;
  std::size_t best = count_crossings(g, layers, slot);
  for (int sweep = 0; sweep < 8 && best > 0; ++sweep) {
    for (std::size_t l = 1; l < layer_count; ++l) barycenter_sort(layers[l], g.up, slot);
    for (std::size_t l = layer_count; l-- > 1;) barycenter_sort(layers[l - 1], g.down, slot);
    const std::size_t c = count_crossings(g, layers, slot);
    if (c < best) {
      best = c;
      best_layers = layers;
      best_slot = slot;
    }
  }
  layout.crossings = best;
  for (const auto& l : best_layers) layout.layer_widths.push_back(l.size());
  for (std::size_t v = 0; v < n; ++v) layout.nodes.push_back({layer[v], best_slot[v]});
  for (std::size_t e = 0; e < layout.edges.size(); ++e)
    for (auto point : chains[e]) layout.edges[e].bends.push_back({g.layer[point], best_slot[point]});
  return layout;
}

}  // namespace counterpoise::models::network
