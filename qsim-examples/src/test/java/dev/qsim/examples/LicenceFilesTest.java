package dev.qsim.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.InputStream;
import java.net.URL;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;

import org.junit.jupiter.api.Test;

/**
 * The licence files every jar carries in {@code META-INF} (copied there from the repository root
 * by the build), and the notices of the bundled Apache Commons libraries that qsim's NOTICE must
 * pass on.
 */
class LicenceFilesTest {

    private static String read(URL url) throws IOException {
        try (InputStream in = url.openStream()) {
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        }
    }

    /**
     * The copy of {@code name} made from the repository root: the one beside this module's
     * classes (other jars on the test class path carry their own).
     */
    private static String own(String name) throws IOException {
        String classes = Main.class.getProtectionDomain().getCodeSource().getLocation()
                .toString();
        for (URL url : Collections.list(Main.class.getClassLoader()
                .getResources("META-INF/" + name))) {
            if (url.toString().startsWith(classes)) {
                return read(url);
            }
        }
        throw new AssertionError("META-INF/" + name + " is not beside " + classes);
    }

    @Test
    void licenceIsTheApacheLicenceVersionTwo() throws IOException {
        String licence = own("LICENSE");
        // The Apache License, Version 2.0 (https://www.apache.org/licenses/LICENSE-2.0.txt):
        // its title, its nine sections and the appendix on how to apply it.
        assertTrue(licence.strip().startsWith("Apache License\n"
                + "                           Version 2.0, January 2004"), licence);
        for (String section : new String[] {"1. Definitions.", "2. Grant of Copyright License.",
            "3. Grant of Patent License.", "4. Redistribution.",
            "5. Submission of Contributions.", "6. Trademarks.",
            "7. Disclaimer of Warranty.", "8. Limitation of Liability.",
            "9. Accepting Warranty or Additional Liability.", "END OF TERMS AND CONDITIONS",
            "APPENDIX: How to apply the Apache License to your work."}) {
            assertTrue(licence.contains(section), section);
        }
    }

    @Test
    void noticePassesOnTheNoticeOfEveryCommonsLibraryOnTheClassPath() throws IOException {
        String notice = own("NOTICE");
        assertTrue(notice.startsWith("qsim\n"), notice);
        // Apache License 2.0, section 4(d): a redistribution must include the readable parts
        // of each bundled work's NOTICE. The Commons jars on this class path are the ones the
        // shaded jar bundles; every line of their NOTICE files must appear in qsim's.
        List<URL> notices = Collections.list(Main.class.getClassLoader()
                .getResources("META-INF/NOTICE"));
        List<String> missing = new ArrayList<>();
        int commons = 0;
        for (URL url : notices) {
            String text = read(url);
            if (!text.startsWith("Apache Commons")) {
                continue;
            }
            commons++;
            for (String line : text.split("\\R")) {
                if (!line.isBlank() && !notice.contains(line.strip())) {
                    missing.add(url + ": " + line);
                }
            }
        }
        // Numbers (complex, core, ...), RNG (client API, simple, core, ...), Statistics.
        assertTrue(commons >= 3, "only " + commons + " Commons NOTICE files in " + notices);
        assertEquals(List.of(), missing);
    }
}
