package dev.pressmark.cli;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.HtmlReport;
import dev.pressmark.core.io.AtomicFiles;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code pressmark report}: the HTML report of a bundle, again. */
@Command(name = "report", mixinStandardHelpOptions = true, description = "Write the HTML report of a bundle.")
final class ReportCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "BUNDLE", description = "The bundle file.")
    Path bundle;

    @Option(names = "--out", required = true, paramLabel = "FILE", description = "The HTML file to write.")
    Path out;

    @Override
    public Integer call() {
        String html = HtmlReport.render(Bundle.read(bundle));
        AtomicFiles.write(out, stream -> stream.write(html.getBytes(StandardCharsets.UTF_8)));
        return Main.EXIT_OK;
    }
}
