package dev.pressmark.core.bundle;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

/**
 * The report's charts as standalone SVG, read back with the JDK's namespace-aware XML parser: a
 * chart that is not well-formed XML in the SVG namespace (SVG 1.1, section 5.1) cannot be served
 * or parsed as an image on its own.
 */
class HtmlReportChartsTest {

    private static final String SVG_NS = "http://www.w3.org/2000/svg";

    private static Bundle frozen() throws IOException {
        try (InputStream in = HtmlReportChartsTest.class.getResourceAsStream("/bundles/format-1.pmb")) {
            return Bundle.read(in.readAllBytes());
        }
    }

    private static Element parse(String svg) throws Exception {
        DocumentBuilderFactory factory = DocumentBuilderFactory.newInstance();
        factory.setNamespaceAware(true);
        Document document = factory.newDocumentBuilder().parse(new ByteArrayInputStream(svg.getBytes(StandardCharsets.UTF_8)));
        return document.getDocumentElement();
    }

    private static List<String> texts(Element svg) {
        NodeList nodes = svg.getElementsByTagNameNS(SVG_NS, "text");
        List<String> texts = new ArrayList<>();
        for (int i = 0; i < nodes.getLength(); i++) {
            texts.add(nodes.item(i).getTextContent());
        }
        return texts;
    }

    @Test
    void the_confusion_chart_is_an_svg_document_with_one_cell_per_pair_of_labels_holding_its_count() throws Exception {
        Bundle bundle = frozen();
        Element svg = parse(HtmlReport.confusionSvg(bundle));
        assertThat(svg.getNamespaceURI()).isEqualTo(SVG_NS);
        assertThat(svg.getLocalName()).isEqualTo("svg");
        assertThat(svg.getAttribute("viewBox")).isEqualTo("0 0 " + svg.getAttribute("width") + " " + svg.getAttribute("height"));
        int k = bundle.labels().size();
        assertThat(svg.getElementsByTagNameNS(SVG_NS, "rect").getLength()).isEqualTo(k * k);
        JsonNode counts = bundle.manifest().path("metrics").path("test_confusion").path("counts");
        List<String> expected = new ArrayList<>(bundle.labels());
        for (int t = 0; t < k; t++) {
            expected.add(bundle.labels().get(t));
            for (int p = 0; p < k; p++) {
                expected.add(Long.toString(counts.path(t).path(p).asLong()));
            }
        }
        assertThat(texts(svg)).containsExactlyElementsOf(expected);
    }

    @Test
    void the_feature_bars_show_the_largest_weights_towards_and_away_from_a_label_in_order() throws Exception {
        Bundle bundle = frozen();
        String label = bundle.labels().get(2);
        Element towards = parse(HtmlReport.featureBarsSvg(bundle, label, true, 5));
        Element away = parse(HtmlReport.featureBarsSvg(bundle, label, false, 5));
        assertThat(towards.getElementsByTagNameNS(SVG_NS, "rect").getLength()).isEqualTo(5);
        assertThat(away.getAttribute("aria-label")).isEqualTo("away from " + label);
        List<Double> up = weightsShown(towards);
        List<Double> down = weightsShown(away);
        assertThat(up).isSortedAccordingTo((a, b) -> Double.compare(b, a)).allSatisfy(w -> assertThat(w).isPositive());
        assertThat(down).isSortedAccordingTo(Double::compare).allSatisfy(w -> assertThat(w).isNegative());
        // The largest weight of the label's score, found by a plain scan of the weight matrix.
        int score = bundle.labels().indexOf(label);
        double largest = Double.NEGATIVE_INFINITY;
        for (int j = 0; j < bundle.pipeline().features().featureCount(); j++) {
            largest = Math.max(largest, bundle.model().weights().weight(score, j));
        }
        assertThat(up.get(0)).isCloseTo(largest, org.assertj.core.data.Offset.offset(0.0005));
    }

    private static List<Double> weightsShown(Element svg) {
        List<String> texts = texts(svg);
        List<Double> weights = new ArrayList<>();
        for (int i = 1; i < texts.size(); i += 2) {
            weights.add(Double.parseDouble(texts.get(i)));
        }
        return weights;
    }

    @Test
    void refuses_a_label_the_model_does_not_have() throws IOException {
        Bundle bundle = frozen();
        assertThatThrownBy(() -> HtmlReport.featureBarsSvg(bundle, "lighting", true, 5))
                .hasMessage("label must be one of electrical, fasteners, garden, plumbing, was \"lighting\"");
    }

    @Test
    void the_whole_report_still_holds_both_charts() throws IOException {
        Bundle bundle = frozen();
        String report = HtmlReport.render(bundle);
        // Inside HTML the parser puts svg elements in the SVG namespace itself, so the report names no namespace: no "http://" in it.
        String namespace = " xmlns=\"" + SVG_NS + "\"";
        assertThat(report).contains(HtmlReport.confusionSvg(bundle).replace(namespace, ""));
        assertThat(report).contains(HtmlReport.featureBarsSvg(bundle, bundle.labels().get(0), true, HtmlReport.TOP_FEATURES).replace(namespace, ""));
        assertThat(report).doesNotContain("http://");
    }
}
