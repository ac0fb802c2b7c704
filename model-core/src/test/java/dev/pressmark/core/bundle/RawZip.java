package dev.pressmark.core.bundle;

import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.zip.CRC32;

/**
 * Writes ZIP files byte by byte after APPNOTE 6.3.x, so that tests can make the files the JDK's
 * writer refuses to make: duplicate names, unsafe names, lying sizes.
 */
final class RawZip {

    private final ByteArrayOutputStream local = new ByteArrayOutputStream();
    private final ByteArrayOutputStream central = new ByteArrayOutputStream();
    private int count;

    RawZip add(String name, byte[] data) {
        return add(name, data, data.length, 0);
    }

    RawZip add(String name, byte[] data, long declaredSize, int method) {
        byte[] nameBytes = name.getBytes(StandardCharsets.UTF_8);
        CRC32 crc = new CRC32();
        crc.update(data);
        int offset = local.size();
        u32(local, 0x04034b50);
        u16(local, 10);
        u16(local, 0x800);
        u16(local, method);
        u32(local, 0x28210000); // 2000-01-01 00:00 in DOS form
        u32(local, crc.getValue());
        u32(local, declaredSize);
        u32(local, declaredSize);
        u16(local, nameBytes.length);
        u16(local, 0);
        local.writeBytes(nameBytes);
        local.writeBytes(data);

        u32(central, 0x02014b50);
        u16(central, 20);
        u16(central, 10);
        u16(central, 0x800);
        u16(central, method);
        u32(central, 0x28210000);
        u32(central, crc.getValue());
        u32(central, declaredSize);
        u32(central, declaredSize);
        u16(central, nameBytes.length);
        u16(central, 0);
        u16(central, 0);
        u16(central, 0);
        u16(central, 0);
        u32(central, 0);
        u32(central, offset);
        central.writeBytes(nameBytes);
        count++;
        return this;
    }

    byte[] bytes() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        out.writeBytes(local.toByteArray());
        out.writeBytes(central.toByteArray());
        u32(out, 0x06054b50);
        u16(out, 0);
        u16(out, 0);
        u16(out, count);
        u16(out, count);
        u32(out, central.size());
        u32(out, local.size());
        u16(out, 0);
        return out.toByteArray();
    }

    private static void u16(ByteArrayOutputStream out, int v) {
        out.write(v & 0xff);
        out.write((v >>> 8) & 0xff);
    }

    private static void u32(ByteArrayOutputStream out, long v) {
        u16(out, (int) (v & 0xffff));
        u16(out, (int) ((v >>> 16) & 0xffff));
    }

    static List<String> names(String... names) {
        return new ArrayList<>(List.of(names));
    }
}
