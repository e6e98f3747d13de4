#include "addin/clip.hpp"

namespace quadrat::addin {

std::size_t rows_to_read(std::size_t block_rows, const std::vector<Clip>& clips,
                         const std::function<bool(std::size_t)>& row_is_empty) {
    for (const Clip& clip : clips) {
        if (clip.sheet_rows != block_rows || clip.used_rows >= block_rows) continue;
        bool rest_is_empty = true;
        for (std::size_t r = clip.used_rows; r < block_rows && rest_is_empty; ++r) rest_is_empty = row_is_empty(r);
        if (rest_is_empty) return clip.used_rows;
    }
    return block_rows;
}

}  // namespace quadrat::addin
