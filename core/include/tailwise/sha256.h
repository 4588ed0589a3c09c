// SHA-256 message digest, as defined in NIST FIPS 180-4, "Secure Hash Standard" (2015), §6.2:
// the message is padded with a 1 bit, zeros and its 64-bit length to a multiple of 512 bits, and
// each 512-bit block is folded into eight 32-bit words by 64 rounds of the compression function
// with the constants K of §4.2.2 and the initial value H(0) of §5.3.3.
#pragma once

#include <array>
#include <cstddef>
#include <cstdint>
#include <string>
#include <string_view>

namespace tailwise {

class Sha256 {
public:
    Sha256();
    void update(std::string_view bytes);
    // The 32-byte digest; the object must not be updated afterwards.
    std::array<std::uint8_t, 32> finish();
    // The digest as 64 lower-case hexadecimal characters.
    std::string finishHex();

private:
    void block(const std::uint8_t *p);
    std::array<std::uint32_t, 8> m_h;
    std::array<std::uint8_t, 64> m_buffer{};
    std::size_t m_used = 0;
    std::uint64_t m_length = 0; // bytes
};

std::string sha256Hex(std::string_view bytes);

} // namespace tailwise
